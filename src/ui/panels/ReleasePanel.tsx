/** Where the release is and what it releases: source geometry and strength, and the contaminant. */
import { choiceOptions } from '../../case/fields';
import { Section } from './Section';
import { currentCase, updateCase } from '../state';
import { mapLengthUnit, positionShown, positionTyped, unitSystem } from '../../case/unitSystem';
import { QuantityField, NumberField, OptionalQuantityField, Segmented, fmtNum, unitLabel } from '../fields';
import { mapTool } from '../view';
import { CONTAMINANT_PRESETS, contaminantPreset, citeValue, provenanceLabel, type ContaminantPreset } from '../../case/presets';
import type { Case } from '../../case/schema';
import { convert } from '../../core/units';
import { fmtInput, fmtLength } from '../format';
import { moveSource, dropFootprint } from '../frame';
import { derivedForScreen } from '../evaluation';

export function ReleasePanel() {
  const c = currentCase.value;
  const src = c.site.source;
  // the width across the flow as the engine takes it, for the case on screen
  const width = derivedForScreen()?.width ?? null;
  const outline = src.footprint !== null;
  const summary = `${outline ? 'Traced outline' : 'Point'}, ${width !== null ? fmtLength(width) : fmtInput('site.source.width', src.width)} across the flow; ${c.contaminant.name || 'contaminant'} at ${fmtNum(c.source.concentration.value)} ${unitLabel(c.source.concentration.unit)}`;
  return (
    <Section id="release" title="Where is the release?" summary={summary}>
      <Segmented
        label="Shape on the map"
        value={outline ? 'outline' : 'point'}
        options={[
          { id: 'point', label: 'Point with a width' },
          { id: 'outline', label: 'Traced outline' },
        ]}
        onChange={(v) => {
          if (v === 'point') updateCase(dropFootprint);
          else mapTool.value = 'trace-footprint';
        }}
      />
      {outline ? (
        <div class="dg-derived" data-testid="source-width">
          <p>
            Width across the flow: <strong>{width !== null ? fmtLength(width) : '…'}</strong>, from the traced outline
            ({src.footprint!.length} corners) and the flow direction; recomputed when either changes. The source plane sits on
            the outline's downgradient edge (common practice).
          </p>
          <div class="dg-btn-row">
            <button type="button" onClick={() => (mapTool.value = 'trace-footprint')}>
              Trace again
            </button>
            <button type="button" onClick={() => updateCase(dropFootprint)}>
              Use a point instead
            </button>
          </div>
        </div>
      ) : (
        <QuantityField
          field="site.source.width"
          dimension="length"
          value={src.width}
          onChange={(q) => updateCase((d) => void (d.site.source.width = q))}
          help="Extent of the release perpendicular to the flow. Drag the hexagon on the map to move the release, or trace its outline."
        />
      )}
      <SourcePosition c={c} />
      <QuantityField
        field="source.concentration"
        dimension="concentration"
        value={c.source.concentration}
        onChange={(q) => updateCase((d) => void (d.source.concentration = q))}
        help="Dissolved concentration in groundwater at the source (from monitoring, or an effective solubility estimate)."
      />
      <QuantityField
        field="source.thickness"
        dimension="length"
        value={c.source.thickness}
        onChange={(q) => updateCase((d) => void (d.source.thickness = q))}
        help="Vertical extent of the dissolved source, from the water table down."
      />
      <OptionalQuantityField
        label="Release"
        field="source.duration"
        dimension="time"
        value={c.source.duration}
        offLabel="Continuous"
        onLabel="Stops after"
        fallback={{ value: 5, unit: 'yr' }}
        onChange={(q) => updateCase((d) => void (d.source.duration = q))}
      />
      <OptionalQuantityField
        label="Source strength"
        field="source.sourceHalfLife"
        dimension="time"
        value={c.source.sourceHalfLife}
        offLabel="Constant"
        onLabel="Halves every"
        fallback={{ value: 10, unit: 'yr' }}
        onChange={(q) => updateCase((d) => void (d.source.sourceHalfLife = q))}
        help="A source that is being depleted or remediated loses strength; a constant source is the cautious choice."
      />
      <Contaminant c={c} />
    </Section>
  );
}

function applyPreset(d: Case, p: ContaminantPreset): void {
  d.contaminant.name = p.name;
  d.contaminant.presetId = p.id;
  if (p.koc) d.contaminant.sorption = { mode: 'koc', koc: { value: p.koc.value, unit: 'L/kg' } };
  else if (p.kd) d.contaminant.sorption = { mode: 'kd', kd: { value: p.kd.value, unit: 'L/kg' } };
  // no decay unless the user picks a site value: the cautious default (the range is shown as a guide)
  d.contaminant.halfLife = null;
  const lim = p.limits[0];
  if (lim) {
    d.contaminant.limit = { value: lim.value, unit: 'mg/L' };
    d.contaminant.limitNote = `Example only (${lim.authority}${lim.basis ? ', ' + lim.basis : ''}). The limit that applies at your site governs.`;
  } else {
    d.contaminant.limitNote = 'No published example limit is on record here: enter the limit that applies at your site.';
  }
}

function Contaminant({ c }: { c: Case }) {
  const k = c.contaminant;
  const preset = k.presetId ? contaminantPreset(k.presetId) : undefined;
  return (
    <div class="dg-group" data-group="contaminant">
      <h3>Contaminant</h3>
      <label class="dg-field">
        <span>Start from published values</span>
        <select
          class="dg-select"
          value={preset?.id ?? ''}
          onChange={(e) => {
            const p = contaminantPreset((e.target as HTMLSelectElement).value);
            if (p) updateCase((d) => applyPreset(d, p));
            else updateCase((d) => void (d.contaminant.presetId = null));
          }}
        >
          <option value="">My own values</option>
          {CONTAMINANT_PRESETS.map((p) => (
            <option value={p.id} key={p.id}>
              {p.name} ({p.group})
            </option>
          ))}
        </select>
      </label>
      {preset && <PresetCard p={preset} />}
      <label class="dg-field">
        <span>Name</span>
        <input
          class="dg-text"
          value={k.name}
          maxLength={200}
          onChange={(e) => updateCase((d) => void (d.contaminant.name = (e.target as HTMLInputElement).value))}
        />
      </label>
      <Segmented
        label="Sorption given as"
        value={k.sorption.mode}
        options={choiceOptions<'koc' | 'kd'>('contaminant.sorption.mode')}
        onChange={(m) =>
          updateCase((d) => {
            if (m === d.contaminant.sorption.mode) return;
            const foc = d.aquifer.fractionOrganicCarbon;
            if (m === 'kd' && d.contaminant.sorption.mode === 'koc') {
              const koc = convert(d.contaminant.sorption.koc.value, d.contaminant.sorption.koc.unit, 'L/kg');
              d.contaminant.sorption = { mode: 'kd', kd: { value: Number((koc * foc).toPrecision(6)), unit: 'L/kg' } };
            } else if (m === 'koc' && d.contaminant.sorption.mode === 'kd') {
              const kd = convert(d.contaminant.sorption.kd.value, d.contaminant.sorption.kd.unit, 'L/kg');
              d.contaminant.sorption = { mode: 'koc', koc: { value: foc > 0 ? Number((kd / foc).toPrecision(6)) : 0, unit: 'L/kg' } };
            }
          })
        }
      />
      {k.sorption.mode === 'koc' ? (
        <QuantityField
          field="contaminant.sorption.koc"
          dimension="partition"
          value={k.sorption.koc}
          onChange={(q) => updateCase((d) => void (d.contaminant.sorption = { mode: 'koc', koc: q }))}
          help="Kd = Koc·foc (foc is set with the aquifer). Published Koc: US EPA 1996 Soil Screening Guidance, e.g. benzene 61.7 L/kg."
        />
      ) : (
        <QuantityField
          field="contaminant.sorption.kd"
          dimension="partition"
          value={k.sorption.kd}
          onChange={(q) => updateCase((d) => void (d.contaminant.sorption = { mode: 'kd', kd: q }))}
          help="0 for a non-sorbing solute such as nitrate (R = 1, common practice)."
        />
      )}
      <OptionalQuantityField
        label="Biodegradation"
        field="contaminant.halfLife"
        dimension="time"
        value={k.halfLife}
        offLabel="None (cautious)"
        onLabel="Half-life"
        fallback={preset?.halfLife ? { value: Number((preset.halfLife.max / 365.25).toPrecision(3)), unit: 'yr' } : { value: 2, unit: 'yr' }}
        onChange={(q) => updateCase((d) => void (d.contaminant.halfLife = q))}
        help={
          preset?.halfLife
            ? `Usual range ${citeValue(preset.halfLife, 'd')}. Half-lives are site-specific; the longest is the cautious end.`
            : 'First-order half-life in groundwater; site-specific. Leave off unless your site has a measured rate.'
        }
      />
      {k.halfLife && (
        <Segmented
          label="Degradation acts on"
          value={k.decayPhase}
          options={choiceOptions<'dissolved-and-sorbed' | 'dissolved-only'>('contaminant.decayPhase')}
          onChange={(v) => updateCase((d) => void (d.contaminant.decayPhase = v))}
        />
      )}
    </div>
  );
}

function PresetCard({ p }: { p: ContaminantPreset }) {
  return (
    <div class="dg-preset" data-testid="preset-card">
      <ul>
        {p.koc && <li>Koc {citeValue(p.koc, 'L/kg')}</li>}
        {p.kd && <li>Kd {citeValue(p.kd, 'L/kg')}</li>}
        {p.halfLife ? (
          <li>Half-life {citeValue({ ...p.halfLife, min: round(p.halfLife.min), max: round(p.halfLife.max) }, 'd')}</li>
        ) : (
          <li>No published half-life range on record.</li>
        )}
        {p.limits.map((l) => (
          <li key={l.authority}>
            Example limit: {fmtNum(l.value)} mg/L{l.basis ? ` ${l.basis}` : ''} — {l.source}
            {provenanceLabel(l) ? ` (${provenanceLabel(l)})` : ''}
          </li>
        ))}
        {p.notes.map((n) => (
          <li key={n}>{n}</li>
        ))}
      </ul>
      <p class="dg-governs">The limit that applies at your site under local rules always governs; set it under “What is at risk?”.</p>
    </div>
  );
}

const round = (v: number) => Number(v.toPrecision(3));


/** The release point as numbers (drag the hexagon on the map, or type here). */
function SourcePosition({ c }: { c: Case }) {
  const [x, y] = c.site.source.position;
  const geo = c.site.frame === 'geographic';
  const set = (p: [number, number]) => updateCase((d) => moveSource(d, p));
  // a local grid position is shown and typed in the case's length unit (m or ft), stored in metres
  const system = unitSystem(c);
  const shown = (v: number) => (geo ? Number(v.toFixed(7)) : positionShown(v, system));
  const typed = (v: number) => (geo ? v : positionTyped(v, system));
  return (
    <div class="dg-pair">
      <NumberField
        label={geo ? 'Release longitude' : 'Release east of datum'}
        field="site.source.position"
        value={shown(x)}
        suffix={geo ? '°' : mapLengthUnit(system).unit}
        onChange={(v) => set([typed(v), y])}
        help={geo ? 'WGS 84 degrees, −180 to 180 (east positive).' : undefined}
      />
      <NumberField
        label={geo ? 'Release latitude' : 'Release north of datum'}
        field="site.source.position"
        value={shown(y)}
        suffix={geo ? '°' : mapLengthUnit(system).unit}
        onChange={(v) => set([x, typed(v)])}
        help={geo ? 'WGS 84 degrees, −90 to 90 (north positive).' : undefined}
      />
    </div>
  );
}
