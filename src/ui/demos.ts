/**
 * Demo cases: the invented scenarios in cases/*.json (see cases/README.md), bundled with the app
 * so they open offline. Each is migrated and validated like any opened file; one that fails is
 * left out of the list and reported in the console rather than shown half-read.
 */
import { migrateCase } from '../case/migrate';
import type { Case } from '../case/schema';
import { newId } from '../case/defaults';

const files = import.meta.glob('../../cases/*.json', { eager: true, import: 'default' }) as Record<string, unknown>;

export interface DemoCase {
  file: string;
  name: string;
  build: () => Case;
}

export const DEMO_CASES: DemoCase[] = Object.entries(files)
  .sort(([a], [b]) => a.localeCompare(b))
  .flatMap(([path, raw]) => {
    try {
      const c = migrateCase(raw);
      const file = path.split('/').pop()!;
      return [
        {
          file,
          name: c.name,
          // a fresh copy with its own id, so editing a demo never overwrites another opened copy
          build: () => {
            const now = new Date().toISOString();
            return { ...structuredClone(c), id: newId(), created: now, modified: now };
          },
        },
      ];
    } catch (e) {
      console.error(`demo case ${path} is not a valid case:`, e);
      return [];
    }
  });
