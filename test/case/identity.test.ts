// Library identity rules (src/case/identity.ts): same content whatever the id, stamps and key
// order; a distinct name for "keep both". Inputs are the project's own demo cases.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { migrateCase } from '../../src/case/migrate';
import { distinctName, sameContent } from '../../src/case/identity';

const demo = () => migrateCase(JSON.parse(readFileSync('cases/fuel-release-farm-well.json', 'utf8')));

describe('case identity', () => {
  it('same content ignores id, stamps and key order; any input change differs', () => {
    const a = demo();
    const b = { ...structuredClone(a), id: 'other', created: '2020-01-01T00:00:00.000Z', modified: '2021-01-01T00:00:00.000Z' };
    expect(sameContent(a, b)).toBe(true);
    const reverseKeys = (v: unknown): unknown =>
      Array.isArray(v) ? v.map(reverseKeys) : v && typeof v === 'object' ? Object.fromEntries(Object.entries(v).reverse().map(([k, x]) => [k, reverseKeys(x)])) : v;
    const reordered = reverseKeys(a) as typeof a;
    expect(JSON.stringify(reordered)).not.toBe(JSON.stringify(a));
    expect(sameContent(a, reordered)).toBe(true);
    const c = structuredClone(a);
    c.source.concentration.value += 1;
    expect(sameContent(a, c)).toBe(false);
    expect(sameContent(a, { ...a, name: a.name + ' x' })).toBe(false);
  });

  it('distinct names count up, ignoring case and spaces', () => {
    expect(distinctName('Depot', [])).toBe('Depot');
    expect(distinctName('Depot', ['depot'])).toBe('Depot (2)');
    expect(distinctName('Depot', ['Depot', 'Depot (2)'])).toBe('Depot (3)');
    expect(distinctName('Depot (2)', ['Depot', 'Depot (2)'])).toBe('Depot (3)');
  });
});
