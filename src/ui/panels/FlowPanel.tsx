/** Which way the water goes and how fast: flow direction (arrow or water levels) and the aquifer. */
import { Section } from './Section';
import { currentCase, updateCase, currentResults } from '../state';
import { QuantityField, NumberField, Segmented, fmtNum, unitLabel } from '../fields';
import { mapTool, selectedId, lastDeleted } from '../view';
import { UndoDelete } from './ReceptorsPanel';
import { MATERIAL_PRESETS, materialPreset, FIELD_RANGES, citeValue } from '../../case/presets';
import type { Case, HeadReading } from '../../case/schema';
import { fmtLength } from '../format';
import { fieldIssue } from '../validity';
import { derivedForScreen } from '../evaluation';

function rangeHelp(field: string, unit: string, lead = 'Usual range'): string {
  const r = FIELD_RANGES.find((x) => x.field === field);
  return r ? `${lead} ${citeValue(r, unit === '–' ? '' : unit).replace(/ \(/, ' (').trim()}.` : '';
}

export function FlowPanel() {
  const c = currentCase.value;
  const flow = c.site.flow;
  const dv = derivedForScreen();
  const k = c.aquifer.hydraulicConductivity;
  const summary =
    (flow.method === 'direction'
      ? `Towards ${fmtNum(flow.azimuthDeg)}°, gradient ${fmtNum(flow.gradient)}`
      : `From ${flow.readings.length} water levels${dv ? `: towards ${fmtNum(dv.azimuthDeg, 3)}°, gradient ${fmtNum(dv.gradient, 2)}` : ''}`) +
    `; K ${fmtNum(k.value)} ${unitLabel(k.unit)}${dv ? `, v ${fmtNum(dv.v, 3)} m/d, R ${fmtNum(dv.R, 3)}` : ''}`;
  return (
    <Section id="flow" title="Which way does the water go?" summary={summary}>
      <Segmented
        label="Flow from"
        value={flow.method}
        options={[
          { id: 'direction', label: 'Arrow and gradient' },
          { id: 'heads', label: 'Water levels in wells' },
        ]}
        onChange={(m) =>
          updateCase((d) => {
            if (m === d.site.flow.method) return;
            // switching away from water levels keeps them for this session, to switch back to
            if (d.site.flow.method === 'heads') stashedReadings.set(d.id, d.site.flow.readings);
            if (m === 'heads') d.site.flow = { method: 'heads', readings: stashedReadings.get(d.id) ?? [] };
            else {
              const az = currentResults.peek()?.derived.azimuthDeg ?? 90;
              const g = currentResults.peek()?.derived.gradient ?? 0.005;
              d.site.flow = { method: 'direction', azimuthDeg: Math.round(az), gradient: Number(g.toPrecision(3)) };
            }
          })
        }
      />
      {flow.method === 'direction' ? (
        <>
          <NumberField
            label="Flow towards (degrees clockwise from north)"
            field="site.flow.azimuthDeg"
            value={flow.azimuthDeg}
            suffix="°"
            onChange={(v) => updateCase((d) => d.site.flow.method === 'direction' && void (d.site.flow.azimuthDeg = v))}
            help="Drag the round handle at the tip of the arrow on the map to turn it."
          />
          <NumberField
            label="Hydraulic gradient i"
            field="site.flow.gradient"
            value={flow.gradient}
            suffix="m/m"
            onChange={(v) => updateCase((d) => d.site.flow.method === 'direction' && void (d.site.flow.gradient = v))}
            help="Head drop per distance along the flow; regional gradients are often 0.0005 – 0.01 (common practice)."
          />
        </>
      ) : (
        <HeadReadings c={c} />
      )}
      {dv && (
        <p class="dg-derived" data-testid="flow-derived">
          Flow towards <strong>{fmtNum(dv.azimuthDeg, 4)}°</strong>, gradient <strong>{fmtNum(dv.gradient, 3)}</strong>;
          seepage velocity v = K·i/nₑ = <strong>{fmtNum(dv.v, 3)} m/d</strong> ({fmtLength(dv.v * 365.25)}/yr), retardation
          factor R = <strong>{fmtNum(dv.R, 3)}</strong> (plume front moves at v/R).
        </p>
      )}
      <Aquifer c={c} />
    </Section>
  );
}

/** Water levels set aside when the flow is switched to an arrow, by case id. */
const stashedReadings = new Map<string, HeadReading[]>();

function HeadReadings({ c }: { c: Case }) {
  if (c.site.flow.method !== 'heads') return null;
  const readings = c.site.flow.readings;
  const fit = currentResults.value?.derived.headFit ?? null;
  const issue = fieldIssue('site.flow');
  return (
    <div class="dg-group" data-group="heads">
      <p class="dg-help">
        Tap <strong>+ Water level</strong>, then each monitoring well on the map (three or more, not in a line), and enter its water
        level (all to the same datum). The gradient and direction come from the best-fit plane through the levels.
      </p>
      <button type="button" class={mapTool.value === 'add-head' ? 'dg-on' : ''} onClick={() => (mapTool.value = mapTool.value === 'add-head' ? 'move' : 'add-head')}>
        {mapTool.value === 'add-head' ? 'Done adding wells' : '+ Water level (tap the map)'}
      </button>
      {issue && <p class="dg-field-error" role="alert">{issue}</p>}
      <UndoDelete what="head" />
      <ol class="dg-list">
        {readings.map((h, i) => (
          <li key={h.id} class={selectedId.value === h.id ? 'dg-selected' : ''} onClick={() => (selectedId.value = h.id)}>
            <input
              class="dg-text dg-name"
              aria-label={`Name of well ${i + 1}`}
              value={h.name}
              maxLength={200}
              onChange={(e) =>
                updateCase((d) => {
                  if (d.site.flow.method === 'heads') d.site.flow.readings[i].name = (e.target as HTMLInputElement).value;
                })
              }
            />
            <QuantityField
              label="Water level"
              field={`site.flow.readings[${i}].head`}
              dimension="length"
              value={h.head}
              onChange={(q) =>
                updateCase((d) => {
                  if (d.site.flow.method === 'heads') d.site.flow.readings[i].head = q;
                })
              }
            />
            {fit && fit.residuals.length === readings.length && (
              <span class="dg-residual" data-testid="head-residual">
                fit residual {fmtLength(fit.residuals[i], 2)}
              </span>
            )}
            <button
              type="button"
              class="dg-danger"
              aria-label={`Remove ${h.name}`}
              onClick={() => {
                lastDeleted.value = { what: 'head', index: i, item: structuredClone(h), caseId: c.id };
                updateCase((d) => {
                  if (d.site.flow.method === 'heads') d.site.flow.readings.splice(i, 1);
                });
              }}
            >
              Remove
            </button>
          </li>
        ))}
      </ol>
      {fit && readings.length === 3 && <p class="dg-help">Three wells define the plane exactly (residuals 0); a fourth checks it.</p>}
    </div>
  );
}

function Aquifer({ c }: { c: Case }) {
  const a = c.aquifer;
  const r = currentResults.value;
  const dv = derivedForScreen();
  const disp = a.dispersivity;
  return (
    <div class="dg-group" data-group="aquifer">
      <h3>Aquifer</h3>
      <label class="dg-field">
        <span>Material (fills in a typical conductivity)</span>
        <select
          class="dg-select"
          value=""
          onChange={(e) => {
            const m = materialPreset((e.target as HTMLSelectElement).value);
            (e.target as HTMLSelectElement).value = '';
            if (!m) return;
            // geometric mean of the published range: the middle of a log-spread quantity
            const k = Math.sqrt(m.conductivity.min * m.conductivity.max);
            updateCase((d) => void (d.aquifer.hydraulicConductivity = { value: Number(k.toPrecision(2)), unit: 'K:m/d' }));
          }}
        >
          <option value="">Pick a material…</option>
          {MATERIAL_PRESETS.map((m) => (
            <option value={m.id} key={m.id}>
              {m.name}: {fmtNum(m.conductivity.min)} – {fmtNum(m.conductivity.max)} m/d
            </option>
          ))}
        </select>
      </label>
      <QuantityField
        label="Hydraulic conductivity K"
        field="aquifer.hydraulicConductivity"
        dimension="conductivity"
        value={a.hydraulicConductivity}
        onChange={(q) => updateCase((d) => void (d.aquifer.hydraulicConductivity = q))}
        help="Fine sand 1 – 5, medium sand 5 – 20, coarse sand 20 – 100, gravel 100 – 1000 m/d (Bouwer 1978, as tabulated in Canter et al. 1988)."
      />
      <NumberField
        label="Effective porosity nₑ"
        field="aquifer.effectivePorosity"
        value={a.effectivePorosity}
        suffix="–"
        onChange={(v) => updateCase((d) => void (d.aquifer.effectivePorosity = v))}
        help="Fraction of the volume water flows through; less than the total porosity."
      />
      <NumberField
        label="Total porosity n"
        field="aquifer.totalPorosity"
        value={a.totalPorosity}
        suffix="–"
        onChange={(v) => updateCase((d) => void (d.aquifer.totalPorosity = v))}
        help={rangeHelp('aquifer.totalPorosity', '–', 'Unconsolidated deposits')}
      />
      <NumberField
        label="Fraction of organic carbon foc"
        field="aquifer.fractionOrganicCarbon"
        value={a.fractionOrganicCarbon}
        suffix="–"
        onChange={(v) => updateCase((d) => void (d.aquifer.fractionOrganicCarbon = v))}
        help="Clean sand ≈ 0.0001 – 0.001 (common practice). Kd = Koc·foc."
      />
      <Segmented
        label="Bulk density"
        value={a.bulkDensity ? 'given' : 'estimate'}
        options={[
          { id: 'estimate', label: 'From porosity' },
          { id: 'given', label: 'Given' },
        ]}
        onChange={(m) =>
          updateCase((d) => {
            d.aquifer.bulkDensity = m === 'estimate' ? null : { value: Number((2.65 * (1 - d.aquifer.totalPorosity)).toPrecision(3)), unit: 'g/cm3' };
          })
        }
      />
      {a.bulkDensity ? (
        <QuantityField
          label="Dry bulk density ρb"
          field="aquifer.bulkDensity"
          dimension="density"
          value={a.bulkDensity}
          onChange={(q) => updateCase((d) => void (d.aquifer.bulkDensity = q))}
        />
      ) : (
        <p class="dg-help">ρb = 2.65 (1 − n) g/cm³ = {fmtNum(2.65 * (1 - a.totalPorosity), 3)} g/cm³ (quartz grains; common practice).</p>
      )}
      <h3>Dispersivity</h3>
      <Segmented
        label="Dispersivity"
        value={disp.mode}
        options={[
          { id: 'estimate', label: 'Estimate from distance' },
          { id: 'given', label: 'My values' },
        ]}
        onChange={(m) =>
          updateCase((d) => {
            if (m === d.aquifer.dispersivity.mode) return;
            if (m === 'given') {
              const last = currentResults.peek()?.derived;
              const ax = last ? Number(last.ax.toPrecision(3)) : 10;
              const ay = last ? Number(last.ay.toPrecision(3)) : 1;
              const az = last ? Number(last.az.toPrecision(3)) : 0.1;
              d.aquifer.dispersivity = {
                mode: 'given',
                longitudinal: { value: ax, unit: 'm' },
                transverse: { value: ay, unit: 'm' },
                vertical: { value: az, unit: 'm' },
              };
            } else d.aquifer.dispersivity = { mode: 'estimate', relation: 'xu-eckstein-1995', transverseRatio: 0.1, verticalRatio: 0.01 };
          })
        }
      />
      {disp.mode === 'estimate' ? (
        <>
          <label class="dg-field">
            <span>Scale relation for αL</span>
            <select
              class="dg-select"
              value={disp.relation}
              onChange={(e) =>
                updateCase((d) => {
                  if (d.aquifer.dispersivity.mode === 'estimate')
                    d.aquifer.dispersivity.relation = (e.target as HTMLSelectElement).value as 'xu-eckstein-1995' | 'tenth-of-distance';
                })
              }
            >
              <option value="xu-eckstein-1995">αL = 0.83 (log₁₀ L)^2.414 (Xu &amp; Eckstein 1995)</option>
              <option value="tenth-of-distance">αL = L / 10 (common practice)</option>
            </select>
          </label>
          <NumberField
            label="αT / αL"
            field="aquifer.dispersivity.transverseRatio"
            value={disp.transverseRatio}
            onChange={(v) => updateCase((d) => d.aquifer.dispersivity.mode === 'estimate' && void (d.aquifer.dispersivity.transverseRatio = v))}
            help="0.1 from Gelhar's high-reliability data; ASTM E1739 uses 1/3 (recalled, to verify)."
          />
          <NumberField
            label="αV / αL"
            field="aquifer.dispersivity.verticalRatio"
            value={disp.verticalRatio}
            onChange={(v) => updateCase((d) => d.aquifer.dispersivity.mode === 'estimate' && void (d.aquifer.dispersivity.verticalRatio = v))}
            help="Vertical is typically ~10× smaller than horizontal transverse (Gelhar et al. 1992); ASTM E1739 uses 1/20 (recalled)."
          />
          {r && dv && (
            <p class="dg-derived" data-testid="dispersivity-derived">
              L = distance to the farthest receptor; αL = <strong>{fmtLength(dv.ax)}</strong>, αT = {fmtLength(dv.ay)}, αV ={' '}
              {fmtLength(dv.az)}
              {r.derived.dispersivityRelation ? ` (${r.derived.dispersivityRelation})` : ''}. Field dispersivities scatter over 2–3
              orders of magnitude at one scale (Gelhar, Welty &amp; Rehfeldt 1992): use site values when you have them.
            </p>
          )}
        </>
      ) : (
        <>
          <QuantityField label="Longitudinal αL" field="aquifer.dispersivity.longitudinal" dimension="length" value={disp.longitudinal}
            onChange={(q) => updateCase((d) => d.aquifer.dispersivity.mode === 'given' && void (d.aquifer.dispersivity.longitudinal = q))} />
          <QuantityField label="Transverse horizontal αT" field="aquifer.dispersivity.transverse" dimension="length" value={disp.transverse}
            onChange={(q) => updateCase((d) => d.aquifer.dispersivity.mode === 'given' && void (d.aquifer.dispersivity.transverse = q))} />
          <QuantityField label="Transverse vertical αV" field="aquifer.dispersivity.vertical" dimension="length" value={disp.vertical}
            onChange={(q) => updateCase((d) => d.aquifer.dispersivity.mode === 'given' && void (d.aquifer.dispersivity.vertical = q))} />
        </>
      )}
      <Segmented
        label="Molecular diffusion"
        value={a.diffusion.include ? 'on' : 'off'}
        options={[
          { id: 'off', label: 'Leave out' },
          { id: 'on', label: 'Include' },
        ]}
        onChange={(v) => updateCase((d) => void (d.aquifer.diffusion.include = v === 'on'))}
      />
      {a.diffusion.include && (
        <>
          <QuantityField label="Free-water diffusion D₀" field="aquifer.diffusion.freeWater" dimension="diffusion" value={a.diffusion.freeWater}
            onChange={(q) => updateCase((d) => void (d.aquifer.diffusion.freeWater = q))}
            help="Small organic molecules in water: about 1e-9 m²/s (common practice). Matters only at very slow flow." />
          <NumberField label="Tortuosity factor τ" field="aquifer.diffusion.tortuosity" value={a.diffusion.tortuosity}
            onChange={(v) => updateCase((d) => void (d.aquifer.diffusion.tortuosity = v))} help="De = D₀·τ; τ between 0 and 1." />
        </>
      )}
    </div>
  );
}
