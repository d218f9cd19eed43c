/**
 * The complete checks run at import, in the case list and at start-up (src/case/check.ts): every
 * class of position that passes the schema but cannot be placed on the site's map is found and
 * named by its case field; the demo cases pass. Accepted ranges: WGS 84 longitude −180…180 and
 * latitude −90…90 (the definition of geographic coordinates), and the app's own 1000 km
 * site-scale limit (src/geo/projection.ts MAX_LOCAL_OFFSET_M).
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { caseProblem, placementProblem } from '../../src/case/check';
import { parseCaseFile } from '../../src/case/io';
import type { Case } from '../../src/case/schema';
import 'fake-indexeddb/auto';
import { freshIndexedDb } from '../store/helpers';
import { CaseStore } from '../../src/store/cases';
import { storedCaseProblem } from '../../src/app/boot';

function demo(file = 'fuel-release-farm-well.json'): Case {
  const r = parseCaseFile(readFileSync(`cases/${file}`, 'utf8'));
  if (!r.ok) throw new Error(r.errors.join('\n'));
  return r.case;
}

const classes: [string, (c: Case) => void, string][] = [
  ['receptor ~1400 km from the datum', (c) => void (c.site.receptors[0].position = [c.site.datum[0] + 20, c.site.datum[1]]), 'site.receptors[0].position'],
  ['datum longitude 500', (c) => void (c.site.datum = [500, 52]), 'site.datum'],
  ['datum latitude 95', (c) => void (c.site.datum = [0, 95]), 'site.datum'],
  ['receptor at 1e308', (c) => void (c.site.receptors[0].position = [1e308, 1e308]), 'site.receptors[0].position'],
  ['release at -1e308', (c) => void (c.site.source.position = [-1e308, 0]), 'site.source.position'],
  [
    'water-level well at latitude 1e308',
    (c) =>
      void (c.site.flow = {
        method: 'heads',
        readings: [
          { id: 'a', name: 'A', position: c.site.datum, head: { value: 10, unit: 'm' } },
          { id: 'b', name: 'B', position: [c.site.datum[0] + 0.001, c.site.datum[1]], head: { value: 9, unit: 'm' } },
          { id: 'c', name: 'C', position: [c.site.datum[0], 1e308], head: { value: 8, unit: 'm' } },
        ],
      }),
    'site.flow.readings[2].position',
  ],
];

describe('placement and screening checks', () => {
  it('every demo case passes', () => {
    for (const f of ['fuel-release-farm-well.json', 'nitrate-field-supply.json', 'solvent-release-creek.json']) {
      expect(caseProblem(demo(f)), f).toBeNull();
    }
  });

  it.each(classes)('%s: refused, naming the field', (_name, edit, field) => {
    const c = demo();
    edit(c);
    expect(placementProblem(c)?.field).toBe(field);
    expect(caseProblem(c)?.field).toBe(field);
  });

  it('a value the engine refuses (effective porosity above total) is found by the complete check, not by placement', () => {
    const c = demo();
    c.aquifer.effectivePorosity = c.aquifer.totalPorosity + 0.1;
    expect(placementProblem(c)).toBeNull();
    expect(caseProblem(c)?.field).toBe('aquifer.effectivePorosity');
  });

  it('the case list marks a stored case that needs repair, and an unreadable record', async () => {
    freshIndexedDb();
    const store = await CaseStore.open({ check: storedCaseProblem });
    const good = demo();
    const bad = { ...demo(), id: 'bad', name: 'Bad datum' };
    bad.site = { ...bad.site, datum: [500, 52] };
    await store.save(good, null);
    await store.save(bad, null);
    const list = await store.list();
    expect(list.find((s) => s.id === good.id)?.problem).toBeNull();
    expect(list.find((s) => s.id === 'bad')?.problem).toMatch(/datum/i);
    store.close();
  });
});
