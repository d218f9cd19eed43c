/**
 * A starting distribution for an input a user makes uncertain in the app, always editable, with
 * where it comes from in its note:
 *   - from a published range the presets carry (presets.ts, sources in docs/field-values.md),
 *     named with its provenance: hydraulic conductivity over the tabulated range of the material
 *     that holds the case's value (Bouwer 1978), total porosity over Freeze & Cherry's range for
 *     it, the contaminant's half-life range (Howard et al. 1991), foc of clean sand (common
 *     practice), dispersivity as a factor spanning two orders of magnitude between the 5th and
 *     95th percentiles (field dispersivities scatter over 2–3 orders of magnitude at one scale:
 *     Gelhar, Welty & Rehfeldt 1992);
 *   - otherwise a spread around the case's own value, said plainly to be an assumption of this
 *     program for the user to replace (there is no published spread of a site's source
 *     concentration or flow direction).
 * Log-uniform over a range that spans a decade or more, uniform over a narrow one.
 */
import type { Case, UncertainInput, UncertainValue } from './schema';
import { contaminantPreset, FIELD_RANGES, MATERIAL_PRESETS, provenanceLabel, type SourcedRange } from './presets';
import { toInternal } from '../core/units';
import { shownDistribution } from './uncertainty';

const ASSUMED = 'an assumption offered by Downgradient as a starting point, not a published value: replace it with your site’s own';

function cited(r: SourcedRange, what: string): string {
  const caveat = provenanceLabel(r);
  return `${what} (${r.source}${caveat ? `; ${caveat}` : ''})`;
}

const round = (v: number) => Number(v.toPrecision(3));

/**
 * A starting distribution for `input` in case `c`, its source in the note (null: the case has no
 * value to start from), in the unit the screen shows the input in (a published K range in ft/d in a
 * US customary case, converted as a converted field is shown: uncertainty.ts shownDistribution).
 */
export function defaultDistribution(c: Case, input: UncertainInput): UncertainValue | null {
  const d = startingDistribution(c, input);
  return d && shownDistribution(c, input, d);
}

/** The starting distribution in the unit of its source (a published range, or the case's field). */
function startingDistribution(c: Case, input: UncertainInput): UncertainValue | null {
  const a = c.aquifer;
  switch (input) {
    case 'hydraulicConductivity': {
      const K = toInternal(a.hydraulicConductivity.value, a.hydraulicConductivity.unit);
      const holding = MATERIAL_PRESETS.filter((m) => m.conductivity.min <= K && K <= m.conductivity.max).sort(
        (x, y) => x.conductivity.max / x.conductivity.min - y.conductivity.max / y.conductivity.min,
      )[0];
      if (holding) {
        const r = holding.conductivity;
        return { kind: 'log-uniform', low: r.min, high: r.max, unit: 'K:m/d', note: cited(r, `the tabulated range for ${holding.name}`) };
      }
      return { kind: 'lognormal', median: round(K), gsd: 3, unit: 'K:m/d', note: `around the case’s value: ${ASSUMED}` };
    }
    case 'totalPorosity': {
      const n = a.totalPorosity;
      const holding = MATERIAL_PRESETS.find((m) => m.totalPorosity && m.totalPorosity.min <= n && n <= m.totalPorosity.max)?.totalPorosity;
      const r = holding ?? FIELD_RANGES.find((f) => f.field === 'aquifer.totalPorosity')!;
      // realisations below the effective porosity would be refused; start above it
      const low = Math.max(r.min, a.effectivePorosity);
      return { kind: 'uniform', low, high: Math.max(r.max, low * 1.1), note: `${cited(r, 'the published range')}${low > r.min ? ', from the effective porosity up' : ''}` };
    }
    case 'effectivePorosity': {
      const ne = a.effectivePorosity;
      return { kind: 'uniform', low: round(0.7 * ne), high: round(Math.min(1.3 * ne, a.totalPorosity)), note: `±30 % around the case’s value, at most the total porosity: ${ASSUMED}` };
    }
    case 'fractionOrganicCarbon': {
      const r = FIELD_RANGES.find((f) => f.field === 'aquifer.fractionOrganicCarbon')!;
      return { kind: 'log-uniform', low: r.min, high: r.max, note: cited(r, 'foc of clean sand') };
    }
    case 'dispersivityFactor':
      return {
        kind: 'lognormal-range',
        low: 0.1,
        high: 10,
        percentile: 5,
        note: 'a factor on the dispersivities, 0.1 to 10 between the 5th and 95th percentiles: field dispersivities scatter over 2–3 orders of magnitude at one scale (Gelhar, Welty & Rehfeldt 1992)',
      };
    case 'halfLife': {
      const r = c.contaminant.presetId ? contaminantPreset(c.contaminant.presetId)?.halfLife : null;
      if (r) return { kind: 'log-uniform', low: r.min, high: r.max, unit: 'd', note: cited(r, `the published half-life range of ${c.contaminant.name}`) };
      const t = c.contaminant.halfLife;
      return t ? { kind: 'lognormal', median: t.value, gsd: 2, unit: t.unit, note: `around the case’s value: ${ASSUMED}` } : null;
    }
    case 'koc': {
      const s = c.contaminant.sorption;
      return s.mode === 'koc' ? { kind: 'lognormal', median: s.koc.value, gsd: 2, unit: s.koc.unit, note: `around the case’s value: ${ASSUMED}` } : null;
    }
    case 'kd': {
      const s = c.contaminant.sorption;
      if (s.mode !== 'kd') return null;
      return s.kd.value > 0
        ? { kind: 'lognormal', median: s.kd.value, gsd: 2, unit: s.kd.unit, note: `around the case’s value: ${ASSUMED}` }
        : { kind: 'uniform', low: 0, high: 0.1, unit: 'L/kg', note: `from no sorption to slight: ${ASSUMED}` };
    }
    case 'gradient':
      return c.site.flow.method === 'direction' ? { kind: 'log-uniform', low: round(c.site.flow.gradient / 2), high: round(Math.min(2 * c.site.flow.gradient, 0.5)), note: `half to twice the case’s value: ${ASSUMED}` } : null;
    case 'flowDirection':
      return c.site.flow.method === 'direction' ? { kind: 'normal', mean: c.site.flow.azimuthDeg, sd: 15, note: `±15° (one standard deviation) around the case’s direction: ${ASSUMED}` } : null;
    case 'sourceConcentration': {
      const q = c.source.concentration;
      return { kind: 'lognormal', median: q.value, gsd: 2, unit: q.unit, note: `around the case’s value: ${ASSUMED}` };
    }
    case 'sourceWidth':
    case 'sourceThickness': {
      const q = input === 'sourceWidth' ? c.site.source.width : c.source.thickness;
      return { kind: 'triangular', low: round(0.5 * q.value), mode: q.value, high: round(1.5 * q.value), unit: q.unit, note: `half to one and a half times the case’s value: ${ASSUMED}` };
    }
    case 'sourceHalfLife':
    case 'releaseDuration': {
      const q = input === 'sourceHalfLife' ? c.source.sourceHalfLife : c.source.duration;
      return q ? { kind: 'lognormal', median: q.value, gsd: 2, unit: q.unit, note: `around the case’s value: ${ASSUMED}` } : null;
    }
  }
}

/** The note of a distribution the user has changed away from its cited starting values. */
export const OWN_VALUES = 'my own values';

const PARAMETER_KEYS = ['low', 'high', 'mode', 'mean', 'sd', 'median', 'gsd', 'percentile'] as const;

/** The same distribution: type, unit, parameters (within rounding) and no truncation on either. */
function sameDistribution(a: UncertainValue, b: UncertainValue): boolean {
  if (a.kind !== b.kind || (a.unit ?? null) !== (b.unit ?? null)) return false;
  if (a.truncate?.low != null || a.truncate?.high != null || b.truncate?.low != null || b.truncate?.high != null) return false;
  const pa = a as unknown as Record<string, number | undefined>;
  const pb = b as unknown as Record<string, number | undefined>;
  return PARAMETER_KEYS.every((k) => pa[k] === pb[k] || (pa[k] !== undefined && pb[k] !== undefined && Math.abs(pa[k]! - pb[k]!) <= 1e-9 * Math.abs(pb[k]!)));
}

/**
 * The source note a distribution carries after the user changed it (its type, a parameter or its
 * truncation): the starting distribution's cited source while it is that distribution again,
 * otherwise "my own values", saying where it started from when that had a source of its own
 * ("my own values (changed from: the tabulated range for medium sand (Bouwer 1978 …))"), so a
 * cited range never stays beside values it no longer describes.
 */
export function noteAfterEdit(c: Case, input: UncertainInput, before: UncertainValue, after: UncertainValue): string {
  const start = defaultDistribution(c, input);
  if (start?.note && sameDistribution(after, start)) return start.note;
  const was = before.note;
  if (!was || was.startsWith(OWN_VALUES)) return was ?? OWN_VALUES;
  const from = `${OWN_VALUES} (changed from: ${was})`;
  return from.length <= 500 ? from : `${from.slice(0, 498)}…)`; // the case file keeps notes to 500 characters
}
