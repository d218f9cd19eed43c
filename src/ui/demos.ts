/**
 * Demo cases: the invented scenarios in cases/*.json (see cases/README.md), shipped with the app so
 * they open offline. Only their names are in the first load (for the picker); a case itself is its
 * own chunk, loaded when picked (precached like every chunk), then migrated and validated like any
 * opened file, so a demo that fails to read is reported, never opened half-read
 * (test/worker/compute.test.ts reads every demo).
 */
import { migrateCase } from '../case/migrate';
import type { Case } from '../case/schema';
import { newId } from '../case/defaults';

const names = import.meta.glob('../../cases/*.json', { eager: true, import: 'name' }) as Record<string, string>;
// a query makes these modules of their own, so the names above do not pull the whole files in
const files = import.meta.glob('../../cases/*.json', { query: '?demo&lang.json', import: 'default' }) as Record<string, () => Promise<unknown>>;

export interface DemoCase {
  file: string;
  name: string;
  /** a fresh copy with its own id, so editing a demo never overwrites another opened copy */
  build: () => Promise<Case>;
}

export const DEMO_CASES: DemoCase[] = Object.keys(names)
  .sort((a, b) => a.localeCompare(b))
  .filter((path) => typeof names[path] === 'string' && files[path])
  .map((path) => ({
    file: path.split('/').pop()!,
    name: names[path],
    build: async () => {
      const c = migrateCase(structuredClone(await files[path]()));
      const now = new Date().toISOString();
      return { ...c, id: newId(), created: now, modified: now };
    },
  }));
