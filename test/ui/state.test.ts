// The app state contract the storage layer builds on (src/ui/state.ts).
import { describe, expect, it } from 'vitest';
import { effect } from '@preact/signals';
import { currentCase, updateCase, replaceCase } from '../../src/ui/state';
import { newCase } from '../../src/case/defaults';
import { caseSchema } from '../../src/case/schema';

describe('app state', () => {
  it('updateCase publishes a new object, leaves the old one as it was, and stamps modified', () => {
    replaceCase(newCase({ now: new Date('2026-01-01T00:00:00Z') }));
    const before = currentCase.value;
    const snapshot = structuredClone(before);
    updateCase((d) => void (d.source.concentration.value = 42));
    const after = currentCase.value;
    expect(after).not.toBe(before);
    expect(before).toEqual(snapshot);
    expect(after.source.concentration.value).toBe(42);
    expect(Date.parse(after.modified)).toBeGreaterThan(Date.parse(before.modified));
    expect(caseSchema.safeParse(after).success).toBe(true);
  });

  it('modified moves strictly forward even for edits within one millisecond', () => {
    replaceCase(newCase());
    const stamps: number[] = [];
    for (let k = 0; k < 50; k++) {
      updateCase((d) => void (d.notes = String(k)));
      stamps.push(Date.parse(currentCase.value.modified));
    }
    for (let k = 1; k < stamps.length; k++) expect(stamps[k]).toBeGreaterThan(stamps[k - 1]);
  });

  it('a subscriber sees each edit once, and replaceCase keeps the given modified', () => {
    const seen: string[] = [];
    const stop = effect(() => void seen.push(currentCase.value.modified));
    updateCase((d) => void (d.name = 'A'));
    updateCase((d) => void (d.name = 'B'));
    const c = newCase({ now: new Date('2020-05-05T00:00:00Z') });
    replaceCase(c);
    stop();
    expect(seen.length).toBe(4);
    expect(seen[3]).toBe('2020-05-05T00:00:00.000Z');
    expect(currentCase.value).not.toBe(c); // a copy: later edits never reach the caller's object
  });
});
