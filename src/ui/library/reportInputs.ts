/**
 * The inputs table of the printed report: every input with its value in the unit the user chose,
 * and where it came from — a published value (with its source and whether it was seen in the
 * publication or recalled), a rule of thumb (common practice), a relation with its citation, or
 * the user's own site value.
 */
import type { Case, Quantity } from '../../case/schema';
import { contaminantPreset, citeValue, provenanceLabel } from '../../case/presets';
import { toInternal } from '../../core/units';
import type { PreparedCase } from '../../case/prepare';
import { show } from './compare';

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

function q(v: Quantity | null, none = 'none'): string {
  return v === null ? none : show(v);
}

export function inputRows(c: Case, prepared: PreparedCase | null): InputRow[] {
  const rows: InputRow[] = [];
  const add = (group: string, input: string, value: string, source = SITE) => rows.push({ group, input, value, source });
  const preset = c.contaminant.presetId ? contaminantPreset(c.contaminant.presetId) : undefined;

  add('Release', 'Contaminant', c.contaminant.name, preset ? `preset “${preset.name}”` : SITE);
  add('Release', 'Source concentration C0', q(c.source.concentration));
  add('Release', 'Source thickness below the water table', q(c.source.thickness));
  add(
    'Release',
    'Source width across the flow',
    prepared?.derived.widthFromFootprint ? `${Number(prepared.derived.width.toPrecision(4))} m` : q(c.site.source.width),
    prepared?.derived.widthFromFootprint ? 'from the traced footprint, measured across the flow direction' : SITE,
  );
  add('Release', 'Release duration', q(c.source.duration, 'continuous'));
  add('Release', 'Source half-life', q(c.source.sourceHalfLife, 'constant source'));

  const f = c.site.flow;
  if (f.method === 'direction') {
    add('Flow', 'Direction groundwater flows towards', `${f.azimuthDeg}° clockwise from north`);
    add('Flow', 'Hydraulic gradient', show(f.gradient));
  } else {
    const g = prepared ? `${Number(prepared.derived.gradient.toPrecision(4))}, towards ${Number(prepared.derived.azimuthDeg.toFixed(1))}°` : 'inputs not valid';
    add('Flow', 'Gradient and direction', g, `plane fitted to ${f.readings.length} head readings (least squares)`);
  }

  const a = c.aquifer;
  add('Aquifer', 'Hydraulic conductivity K', q(a.hydraulicConductivity));
  add('Aquifer', 'Effective porosity nₑ', show(a.effectivePorosity));
  add('Aquifer', 'Total porosity n', show(a.totalPorosity));
  add(
    'Aquifer',
    'Bulk density ρb',
    a.bulkDensity ? q(a.bulkDensity) : prepared ? `${Number(prepared.derived.bulkDensity.toPrecision(4))} g/cm³` : 'estimated',
    a.bulkDensity ? SITE : 'estimated as 2.65 (1 − n) g/cm³ (quartz grains; common practice)',
  );
  add('Aquifer', 'Fraction of organic carbon foc', show(a.fractionOrganicCarbon));
  const d = a.dispersivity;
  if (d.mode === 'given') {
    add('Aquifer', 'Dispersivity αL / αT / αV', `${show(d.longitudinal)} / ${show(d.transverse)} / ${show(d.vertical)}`);
  } else {
    const dr = prepared?.derived.dispersivityRelation;
    const est = prepared ? `${[prepared.derived.ax, prepared.derived.ay, prepared.derived.az].map((x) => Number(x.toPrecision(3))).join(' / ')} m` : 'estimated';
    add(
      'Aquifer',
      'Dispersivity αL / αT / αV',
      est,
      `αL from ${dr?.citation ?? d.relation}${dr?.scaleDistance ? ` at ${Number(dr.scaleDistance.toPrecision(3))} m` : ''}; αT = ${d.transverseRatio}·αL, αV = ${d.verticalRatio}·αL (ratios: common practice)`,
    );
  }
  add(
    'Aquifer',
    'Molecular diffusion',
    a.diffusion.include ? `${q(a.diffusion.freeWater)} × tortuosity ${a.diffusion.tortuosity}` : 'not included',
  );

  const s = c.contaminant.sorption;
  if (s.mode === 'koc') {
    const koc = toInternal(s.koc.value, s.koc.unit);
    const pub = preset?.koc && near(preset.koc.value, koc) ? citeValue(preset.koc, 'L/kg') : SITE;
    add('Contaminant', 'Koc (Kd = Koc·foc)', q(s.koc), pub);
  } else {
    const kd = toInternal(s.kd.value, s.kd.unit);
    add('Contaminant', 'Kd', q(s.kd), preset?.kd && near(preset.kd.value, kd) ? citeValue(preset.kd, 'L/kg') : SITE);
  }
  add(
    'Contaminant',
    'Biodegradation half-life',
    q(c.contaminant.halfLife, 'no degradation'),
    preset?.halfLife ? `${SITE}; published range ${citeValue(preset.halfLife, 'd')}` : SITE,
  );
  add('Contaminant', 'Decay acts on', c.contaminant.decayPhase === 'dissolved-only' ? 'dissolved phase only' : 'dissolved and sorbed mass');
  const limit = toInternal(c.contaminant.limit.value, c.contaminant.limit.unit);
  const lim = preset?.limits.find((l) => near(l.value, limit));
  const limSource = lim ? `example: ${lim.authority} (${lim.source}${provenanceLabel(lim) ? '; ' + provenanceLabel(lim) : ''})` : SITE;
  add('Contaminant', 'Concentration limit', q(c.contaminant.limit), [limSource, c.contaminant.limitNote].filter(Boolean).join('. '));

  const e = c.evaluation;
  add('Evaluation', 'Solution', e.solution === 'domenico' ? 'Domenico (1987) approximation' : 'exact rectangular-source solution');
  add('Evaluation', 'Horizon', q(e.horizon));
  add('Evaluation', 'Map time', q(e.viewTime, 'steady state'));
  add('Evaluation', 'Map depth below the water table', q(e.depth));
  return rows;
}
