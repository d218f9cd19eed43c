/**
 * Which inputs vary, and how: one row per input this case can make uncertain. Ticking "varies"
 * gives the input a starting distribution with its source in words (case/uncertaintyDefaults.ts:
 * a published range the presets carry, or a spread said to be this program's assumption); then
 * the distribution's type and parameters are edited in the field's own unit. Each row is checked
 * as the run will check it (case/uncertainty.ts planInput) and says what is wrong, naming the
 * input and the accepted range, below the row; nothing is run until it passes, and what was typed
 * is kept. Changing the type keeps the spread: the new distribution is fitted to the old one's
 * 5th, 50th and 95th percentiles. Flow from four or more water levels offers the direction and
 * gradient uncertainty of the plane fit instead.
 */
import { currentCase, updateCase } from '../state';
import { NumberField, unitLabel } from '../fields';
import { UNCERTAIN_INPUTS, type Case, type UncertainInput, type UncertainValue } from '../../case/schema';
import { defaultUnit, INPUT_DEFINITIONS, notApplicable, planInput, shownDistribution, truncationStart } from '../../case/uncertainty';
import { defaultDistribution, noteAfterEdit } from '../../case/uncertaintyDefaults';
import { detailOf } from '../../case/checked';
import { normalQuantile } from '../../core/uncertainty';

type Kind = UncertainValue['kind'];

const KINDS: { id: Kind; label: string }[] = [
  { id: 'uniform', label: 'uniform (low – high)' },
  { id: 'log-uniform', label: 'log-uniform (low – high)' },
  { id: 'triangular', label: 'triangular (low, most likely, high)' },
  { id: 'normal', label: 'normal (mean, standard deviation)' },
  { id: 'lognormal', label: 'lognormal (median, geometric SD)' },
  { id: 'lognormal-range', label: 'lognormal (low – high as percentiles)' },
];

/** The parameters of each type, with their words. */
const PARAMS: Record<Kind, { key: string; words: string; unitless?: boolean }[]> = {
  uniform: [
    { key: 'low', words: 'low' },
    { key: 'high', words: 'high' },
  ],
  'log-uniform': [
    { key: 'low', words: 'low' },
    { key: 'high', words: 'high' },
  ],
  triangular: [
    { key: 'low', words: 'low' },
    { key: 'mode', words: 'most likely' },
    { key: 'high', words: 'high' },
  ],
  normal: [
    { key: 'mean', words: 'mean' },
    { key: 'sd', words: 'standard deviation' },
  ],
  lognormal: [
    { key: 'median', words: 'median' },
    { key: 'gsd', words: 'geometric SD', unitless: true },
  ],
  'lognormal-range': [
    { key: 'low', words: 'low' },
    { key: 'high', words: 'high' },
    { key: 'percentile', words: 'read as percentile', unitless: true },
  ],
};

const sig = (v: number) => Number(v.toPrecision(3));

/** A distribution of another type with the same 5th, 50th and 95th percentiles (as near as the type allows). */
export function refitDistribution(d: UncertainValue, kind: Kind, p5: number, p50: number, p95: number): UncertainValue {
  const z = normalQuantile(0.95);
  const { unit, note, truncate } = d;
  const keep = { ...(unit ? { unit } : {}), ...(note ? { note } : {}), ...(truncate ? { truncate } : {}) };
  switch (kind) {
    case 'uniform':
    case 'log-uniform':
      return { kind, low: sig(p5), high: sig(p95), ...keep };
    case 'triangular':
      return { kind, low: sig(p5), mode: sig(p50), high: sig(p95), ...keep };
    case 'normal':
      return { kind, mean: sig(p50), sd: sig((p95 - p5) / (2 * z)), ...keep };
    case 'lognormal':
      return { kind, median: sig(p50), gsd: sig(Math.exp(Math.log(p95 / p5) / (2 * z))), ...keep };
    case 'lognormal-range':
      return { kind, low: sig(p5), high: sig(p95), percentile: 5, ...keep };
  }
}

function samplerOf(c: Case, input: UncertainInput, d: UncertainValue | null) {
  try {
    return d ? planInput(c, input, d).sampler : null;
  } catch {
    return null;
  }
}

export function DistributionEditor() {
  const c = currentCase.value;
  const inputs = UNCERTAIN_INPUTS.filter((k) => !notApplicable(c, k));
  const heads = c.site.flow.method === 'heads' ? c.site.flow.readings.length : 0;
  return (
    <fieldset class="dg-mc-editor" data-testid="distribution-editor">
      <legend>Which inputs vary (each sampled independently of the others)</legend>
      {heads >= 4 && (
        <label class="dg-check">
          <input type="checkbox" checked={c.uncertainty.headFit} onChange={(e) => updateCase((d) => void (d.uncertainty.headFit = (e.target as HTMLInputElement).checked))} />
          flow direction and gradient from the spread of the {heads} water levels about their fitted plane (least-squares covariance)
        </label>
      )}
      {inputs.map((k) => (
        <InputRow key={k} c={c} input={k} />
      ))}
    </fieldset>
  );
}

function InputRow({ c, input }: { c: Case; input: UncertainInput }) {
  const def = INPUT_DEFINITIONS[input];
  const stored = c.uncertainty.inputs[input];
  // shown and edited in the case's units (ft/d in a US customary case); an edit stores what is shown
  // with the typed value exact, so nothing drifts m → ft → m (case/uncertainty.ts distributionIn)
  const d = stored && shownDistribution(c, input, stored);
  const start = d ? null : defaultDistribution(c, input);
  let problem: string | null = null;
  let planned: ReturnType<typeof planInput> | null = null;
  if (d) {
    try {
      planned = planInput(c, input, d);
    } catch (e) {
      problem = detailOf(e);
    }
  }
  const unit = d?.unit ?? defaultUnit(input, c);
  const unitText = unit ? unitLabel(unit) : input === 'flowDirection' ? '° from north' : '';
  const set = (next: UncertainValue | undefined) =>
    updateCase((draft) => {
      if (next) draft.uncertainty.inputs[input] = next;
      else delete draft.uncertainty.inputs[input];
    });
  // a change of type, parameter or bounds: the source note follows (the cited one, or "my own values")
  const change = (next: UncertainValue) => stored && set({ ...next, note: noteAfterEdit(c, input, stored, next) });
  return (
    <div class={`dg-mc-row${problem ? ' dg-invalid' : ''}`} data-input={input}>
      <label class="dg-check">
        <input type="checkbox" checked={!!d} disabled={!d && !start} onChange={(e) => set((e.target as HTMLInputElement).checked ? (start ?? undefined) : undefined)} />
        <span>
          <strong>{def.label}</strong> varies
          {!d && !start && <span class="dg-note"> (give the case a value first)</span>}
        </span>
      </label>
      {d && (
        <div class="dg-mc-params">
          <label class="dg-mc-kind">
            <span>{def.label}: distribution</span>
            <select
              value={d.kind}
              onChange={(e) => {
                const kind = (e.target as HTMLSelectElement).value as Kind;
                // the spread of the distribution as it is, or, when that is not valid, of the starting one
                const s = planned?.sampler ?? samplerOf(c, input, defaultDistribution(c, input));
                if (s) change(refitDistribution(d, kind, s.sample(0.05), s.median, s.sample(0.95)));
              }}
            >
              {KINDS.map((o) => (
                <option key={o.id} value={o.id}>
                  {o.label}
                </option>
              ))}
            </select>
          </label>
          {PARAMS[d.kind].map((p) => (
            <NumberField
              key={p.key}
              label={`${def.label}: ${p.words}`}
              field={`uncertainty.inputs.${input}.${p.key}`}
              value={(d as unknown as Record<string, number>)[p.key]}
              suffix={p.unitless || (p.key === 'sd' && input !== 'flowDirection' && !unit) ? undefined : unitText || undefined}
              onChange={(v) => change({ ...d, [p.key]: v } as UncertainValue)}
            />
          ))}
          <Truncation input={input} label={def.label} d={d} unitText={unitText} start={truncationStart(c, input, d)} change={change} />
          {problem && (
            <p class="dg-field-error" role="alert">
              {problem}
            </p>
          )}
          {d.note && <p class="dg-help">Source: {d.note}</p>}
        </div>
      )}
    </div>
  );
}

/**
 * Optional bounds the distribution is truncated to (its probability between them rescaled to 1):
 * each side added or removed on its own, starting at the 1st or 99th percentile of the part of the
 * distribution inside the input's physical range (case/uncertainty.ts truncationStart).
 * The run's check (planInput) says when the bounds leave nothing or the distribution still puts
 * probability outside the input's physical range.
 */
function Truncation(props: { input: UncertainInput; label: string; d: UncertainValue; unitText: string; start: { low: number; high: number } | null; change: (next: UncertainValue) => void }) {
  const { input, label, d, unitText, start: from, change } = props;
  const t = d.truncate ?? {};
  const setBound = (side: 'low' | 'high', v: number | null) => {
    const next = { ...t, [side]: v };
    const kept = next.low != null || next.high != null;
    const { truncate: _old, ...rest } = d;
    change((kept ? { ...rest, truncate: { ...(next.low != null ? { low: next.low } : {}), ...(next.high != null ? { high: next.high } : {}) } } : rest) as UncertainValue);
  };
  const sides = [
    { side: 'low' as const, words: 'truncated below', add: 'Truncate below', start: from ? sig(from.low) : null },
    { side: 'high' as const, words: 'truncated above', add: 'Truncate above', start: from ? sig(from.high) : null },
  ];
  return (
    <div class="dg-mc-truncate">
      {sides.map(({ side, words, add, start }) => {
        const v = t[side];
        return v != null ? (
          <div class="dg-mc-bound" key={side}>
            <NumberField label={`${label}: ${words}`} field={`uncertainty.inputs.${input}.truncate.${side}`} value={v} suffix={unitText || undefined} onChange={(x) => setBound(side, x)} />
            <button type="button" onClick={() => setBound(side, null)} aria-label={`${label}: remove ${side === 'low' ? 'lower' : 'upper'} bound`}>
              Remove {side === 'low' ? 'lower' : 'upper'} bound
            </button>
          </div>
        ) : (
          <button type="button" key={side} disabled={start === null} onClick={() => start !== null && setBound(side, start)} aria-label={`${label}: ${add.toLowerCase()}`}>
            {add}
          </button>
        );
      })}
    </div>
  );
}
