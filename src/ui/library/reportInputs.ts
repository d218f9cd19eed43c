/**
 * The inputs table of the printed report: every input with its value in the unit the user chose,
 * and where it came from — a published value (with its source and whether it was seen in the
 * publication or recalled), a rule of thumb (common practice), a relation with its citation, or
 * the user's own site value.
 */
import type { Case, Quantity } from '../../case/schema';
import { contaminantPreset, citeValue, provenanceLabel } from '../../case/presets';
import { fromInternal, toInternal, UNITS } from '../../core/units';
import type { PreparedCase } from '../../case/prepare';
import { resultUnit, shownQuantity } from '../../case/unitSystem';
import { quantityText, show } from './compare';
import { roundSig } from '../../case/numbers';

export interface InputRow {
  group: string;
  input: string;
  value: string;
  source: string;
}

const SITE = 'entered for this site';

function near(a: number, b: number): boolean {
  return Math.abs(a - b) <= 1e-9 * Math.max(Math.abs(a), Math.abs(b), 1e-30);
}

export function inputRows(c: Case, prepared: PreparedCase | null): InputRow[] {
  // each quantity as its field shows it: the case's unit system, or the field's own unit
  // (a converted value to 4 significant digits, so 5 m reads 16.4 ft, not 16.4042 ft)
  const q = (field: string, v: Quantity | null, none = 'none'): string => {
    if (v === null) return none;
    const s = shownQuantity(c, field, v);
    return s === v ? show(v) : quantityText(roundSig(s.value, 4), s.unit);
  };
  // a derived value (internal units) in the unit the case's system shows its dimension in
  const derived = (v: number, dimension: 'length' | 'density', digits = 4): string => {
    const u = resultUnit(c, dimension);
    return quantityText(Number(fromInternal(v, u).toPrecision(digits)), u);
  };
  const lengthLabel = UNITS[resultUnit(c, 'length')].label;
  const rows: InputRow[] = [];
  const add = (group: string, input: string, value: string, source = SITE) => rows.push({ group, input, value, source });
  const preset = c.contaminant.presetId ? contaminantPreset(c.contaminant.presetId) : undefined;

  add('Release', 'Contaminant', c.contaminant.name, preset ? `preset “${preset.name}”` : SITE);
  add('Release', 'Source concentration C0', q('source.concentration', c.source.concentration));
  add('Release', 'Source thickness below the water table', q('source.thickness', c.source.thickness));
  add(
    'Release',
    'Source width across the flow',
    prepared?.derived.widthFromFootprint ? derived(prepared.derived.width, 'length') : q('site.source.width', c.site.source.width),
    prepared?.derived.widthFromFootprint ? 'from the traced footprint, measured across the flow direction' : SITE,
  );
  add('Release', 'Release duration', q('source.duration', c.source.duration, 'continuous'));
  add('Release', 'Source half-life', q('source.sourceHalfLife', c.source.sourceHalfLife, 'constant source'));

  const f = c.site.flow;
  if (f.method === 'direction') {
    add('Flow', 'Direction groundwater flows towards', `${f.azimuthDeg}° clockwise from north`);
    add('Flow', 'Hydraulic gradient', show(f.gradient));
  } else {
    const g = prepared ? `${Number(prepared.derived.gradient.toPrecision(4))}, towards ${Number(prepared.derived.azimuthDeg.toFixed(1))}°` : 'inputs not valid';
    add('Flow', 'Gradient and direction', g, `plane fitted to ${f.readings.length} head readings (least squares)`);
  }

  const a = c.aquifer;
  add('Aquifer', 'Hydraulic conductivity K', q('aquifer.hydraulicConductivity', a.hydraulicConductivity));
  add('Aquifer', 'Effective porosity nₑ', show(a.effectivePorosity));
  add('Aquifer', 'Total porosity n', show(a.totalPorosity));
  add(
    'Aquifer',
    'Bulk density ρb',
    a.bulkDensity ? q('aquifer.bulkDensity', a.bulkDensity) : prepared ? derived(prepared.derived.bulkDensity, 'density') : 'estimated',
    // the grain density of quartz, 2.65 g/cm³, in the system's unit (165.4 lb/ft³)
    a.bulkDensity ? SITE : `estimated as ${derived(2.65, 'density')} × (1 − n) (quartz grains; common practice)`,
  );
  add('Aquifer', 'Fraction of organic carbon foc', show(a.fractionOrganicCarbon));
  const d = a.dispersivity;
  if (d.mode === 'given') {
    add('Aquifer', 'Dispersivity αL / αT / αV', `${q('aquifer.dispersivity.longitudinal', d.longitudinal)} / ${q('aquifer.dispersivity.transverse', d.transverse)} / ${q('aquifer.dispersivity.vertical', d.vertical)}`);
  } else {
    const dr = prepared?.derived.dispersivityRelation;
    const est = prepared ? `${[prepared.derived.ax, prepared.derived.ay, prepared.derived.az].map((x) => Number(fromInternal(x, resultUnit(c, 'length')).toPrecision(3))).join(' / ')} ${lengthLabel}` : 'estimated';
    add(
      'Aquifer',
      'Dispersivity αL / αT / αV',
      est,
      `αL from ${dr?.citation ?? d.relation}${dr?.scaleDistance ? ` at ${derived(dr.scaleDistance, 'length', 3)}` : ''}; αT = ${d.transverseRatio}·αL, αV = ${d.verticalRatio}·αL (ratios: common practice)`,
    );
  }
  add(
    'Aquifer',
    'Molecular diffusion',
    a.diffusion.include ? `${q('aquifer.diffusion.freeWater', a.diffusion.freeWater)} × tortuosity ${a.diffusion.tortuosity}` : 'not included',
  );

  const s = c.contaminant.sorption;
  if (s.mode === 'koc') {
    const koc = toInternal(s.koc.value, s.koc.unit);
    const pub = preset?.koc && near(preset.koc.value, koc) ? citeValue(preset.koc, 'L/kg') : SITE;
    add('Contaminant', 'Koc (Kd = Koc·foc)', q('contaminant.sorption.koc', s.koc), pub);
  } else {
    const kd = toInternal(s.kd.value, s.kd.unit);
    add('Contaminant', 'Kd', q('contaminant.sorption.kd', s.kd), preset?.kd && near(preset.kd.value, kd) ? citeValue(preset.kd, 'L/kg') : SITE);
  }
  add(
    'Contaminant',
    'Biodegradation half-life',
    q('contaminant.halfLife', c.contaminant.halfLife, 'no degradation'),
    preset?.halfLife ? `${SITE}; published range ${citeValue(preset.halfLife, 'd')}` : SITE,
  );
  add('Contaminant', 'Decay acts on', c.contaminant.decayPhase === 'dissolved-only' ? 'dissolved phase only' : 'dissolved and sorbed mass');
  const limit = toInternal(c.contaminant.limit.value, c.contaminant.limit.unit);
  const lim = preset?.limits.find((l) => near(l.value, limit));
  const limSource = lim ? `example: ${lim.authority} (${lim.source}${provenanceLabel(lim) ? '; ' + provenanceLabel(lim) : ''})` : SITE;
  add('Contaminant', 'Concentration limit', q('contaminant.limit', c.contaminant.limit), [limSource, c.contaminant.limitNote].filter(Boolean).join('. '));

  const e = c.evaluation;
  add('Evaluation', 'Solution', e.solution === 'domenico' ? 'Domenico (1987) approximation' : 'exact rectangular-source solution');
  add('Evaluation', 'Horizon', q('evaluation.horizon', e.horizon));
  add('Evaluation', 'Map time', q('evaluation.viewTime', e.viewTime, 'steady state'));
  add('Evaluation', 'Map depth below the water table', q('evaluation.depth', e.depth));
  return rows;
}
