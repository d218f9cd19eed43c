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

describe('case history (undo / redo of whole edits)', () => {
  it('undo restores the case before the last edit, whatever field it was; redo reapplies it', async () => {
    const { undoEdit, redoEdit, canUndo, canRedo, COALESCE_MS } = await import('../../src/ui/state');
    replaceCase(newCase());
    const start = structuredClone(currentCase.value);
    let t = 1e12;
    updateCase((d) => void (d.contaminant.limit.value = 5), (t += 10_000));
    updateCase((d) => void (d.source.concentration.value = 42), (t += 10_000));
    const afterBoth = structuredClone(currentCase.value);
    expect(undoEdit()).toBe(true);
    expect(currentCase.value.source.concentration.value).toBe(start.source.concentration.value);
    expect(currentCase.value.contaminant.limit.value).toBe(5);
    expect(undoEdit()).toBe(true);
    expect({ ...currentCase.value, modified: '' }).toEqual({ ...start, modified: '' });
    expect(canUndo.value).toBe(false);
    expect(undoEdit()).toBe(false);
    // each step is a new edit for autosave: modified keeps moving forward
    expect(Date.parse(currentCase.value.modified)).toBeGreaterThan(Date.parse(afterBoth.modified));
    expect(redoEdit()).toBe(true);
    expect(redoEdit()).toBe(true);
    expect({ ...currentCase.value, modified: '' }).toEqual({ ...afterBoth, modified: '' });
    expect(canRedo.value).toBe(false);
    // a new edit after an undo drops the redo branch
    undoEdit();
    updateCase((d) => void (d.notes = 'branch'), (t += 10_000));
    expect(canRedo.value).toBe(false);
    // keystrokes (or a drag) closer than COALESCE_MS apart are one step
    t += 10_000;
    for (const v of [6, 60, 600, 6000]) updateCase((d) => void (d.contaminant.limit.value = v), (t += COALESCE_MS / 4));
    undoEdit();
    expect(currentCase.value.contaminant.limit.value).toBe(5);
    expect(currentCase.value.notes).toBe('branch');
  });

  it('another case on screen clears the history; the same case replaced keeps it', async () => {
    const { canUndo } = await import('../../src/ui/state');
    replaceCase(newCase());
    updateCase((d) => void (d.notes = 'x'));
    replaceCase({ ...currentCase.value });
    expect(canUndo.value).toBe(true);
    replaceCase(newCase());
    expect(canUndo.value).toBe(false);
  });
});
