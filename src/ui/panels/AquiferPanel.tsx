/**
 * What the ground is like: conductivity (with a material picker), porosities, organic carbon and
 * bulk density (which set the retardation), dispersivity and molecular diffusion.
 */
import { choiceOptions } from '../../case/fields';
import { Section } from './Section';
import { currentCase, updateCase, currentResults } from '../state';
import { QuantityField, NumberField, Segmented, fmtNum, unitLabel } from '../fields';
import { MATERIAL_PRESETS, materialPreset, materialOfConductivity, typicalConductivity, FIELD_RANGES, citeValue } from '../../case/presets';
import { fromInternal, toInternal } from '../../core/units';
import { shownQuantity } from '../../case/unitSystem';
import { fmtInput, fmtLength } from '../format';
import { derivedForScreen } from '../evaluation';
import { SaturatedThicknessField } from './WellInputs';

function rangeHelp(field: string, unit: string, lead = 'Usual range'): string {
  const r = FIELD_RANGES.find((x) => x.field === field);
  return r ? `${lead} ${citeValue(r, unit === '–' ? '' : unit).replace(/ \(/, ' (').trim()}.` : '';
}

export function AquiferPanel() {
  const c = currentCase.value;
  const a = c.aquifer;
  const r = currentResults.value;
  const dv = derivedForScreen();
  const disp = a.dispersivity;
  const k = a.hydraulicConductivity;
  // the material that filled K in stays shown until K is changed to anything else
  const material = materialOfConductivity(toInternal(k.value, k.unit));
  // the published ranges (m/d) in the unit the K field shows: the case's system or the field's own
  const kUnit = shownQuantity(c, 'aquifer.hydraulicConductivity', k).unit;
  const kIn = (mPerDay: number) => fmtNum(fromInternal(mPerDay, kUnit), 2);
  const kLabel = unitLabel(kUnit);
  const summary =
    `K ${fmtInput('aquifer.hydraulicConductivity', k)}, nₑ ${fmtNum(a.effectivePorosity)}` +
    (dv ? `; R ${fmtNum(dv.R, 3)}, αL ${fmtLength(dv.ax)}` : '');
  return (
    <Section id="aquifer" title="What is the ground like?" summary={summary}>
      <div class="dg-group" data-group="aquifer">
        <label class="dg-field">
          <span>Material (fills in a typical conductivity)</span>
          <select
            class="dg-select"
            value={material?.id ?? ''}
            onChange={(e) => {
              const m = materialPreset((e.target as HTMLSelectElement).value);
              if (!m) return;
              updateCase((d) => void (d.aquifer.hydraulicConductivity = { value: typicalConductivity(m), unit: 'K:m/d' }));
            }}
          >
            <option value="">Pick a material…</option>
            {MATERIAL_PRESETS.map((m) => (
              <option value={m.id} key={m.id}>
                {m.name}: {kIn(m.conductivity.min)} – {kIn(m.conductivity.max)} {kLabel}
              </option>
            ))}
          </select>
        </label>
        <QuantityField
          field="aquifer.hydraulicConductivity"
          dimension="conductivity"
          value={a.hydraulicConductivity}
          onChange={(q) => updateCase((d) => void (d.aquifer.hydraulicConductivity = q))}
          help={`${MATERIAL_PRESETS.slice(0, 4)
            .map((m, i) => `${i ? m.name : m.name[0].toUpperCase() + m.name.slice(1)} ${kIn(m.conductivity.min)} – ${kIn(m.conductivity.max)}`)
            .join(', ')} ${kLabel} (Bouwer 1978, as tabulated in Canter, Knox & Fairchild 1988, Table 2.1).`}
        />
        <NumberField
          field="aquifer.effectivePorosity"
          value={a.effectivePorosity}
          suffix="–"
          onChange={(v) => updateCase((d) => void (d.aquifer.effectivePorosity = v))}
          help="Fraction of the volume water flows through; less than the total porosity."
        />
        <NumberField
          field="aquifer.totalPorosity"
          value={a.totalPorosity}
          suffix="–"
          onChange={(v) => updateCase((d) => void (d.aquifer.totalPorosity = v))}
          help={rangeHelp('aquifer.totalPorosity', '–', 'Unconsolidated deposits')}
        />
        <NumberField
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
            field="aquifer.bulkDensity"
            dimension="density"
            value={a.bulkDensity}
            onChange={(q) => updateCase((d) => void (d.aquifer.bulkDensity = q))}
          />
        ) : (
          <p class="dg-help">ρb = 2.65 (1 − n) g/cm³ = {fmtNum(2.65 * (1 - a.totalPorosity), 3)} g/cm³ (quartz grains; common practice).</p>
        )}
        <SaturatedThicknessField />
        <h3>Dispersivity</h3>
        <Segmented
          label="Dispersivity"
          value={disp.mode}
          options={choiceOptions<'estimate' | 'given'>('aquifer.dispersivity.mode')}
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
              field="aquifer.dispersivity.transverseRatio"
              value={disp.transverseRatio}
              onChange={(v) => updateCase((d) => d.aquifer.dispersivity.mode === 'estimate' && void (d.aquifer.dispersivity.transverseRatio = v))}
              help="0.1 from Gelhar's high-reliability data; ASTM E1739 uses 1/3, as commonly cited."
            />
            <NumberField
              field="aquifer.dispersivity.verticalRatio"
              value={disp.verticalRatio}
              onChange={(v) => updateCase((d) => d.aquifer.dispersivity.mode === 'estimate' && void (d.aquifer.dispersivity.verticalRatio = v))}
              help="Vertical is typically ~10× smaller than horizontal transverse (Gelhar et al. 1992); ASTM E1739 uses 1/20, as commonly cited."
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
            <QuantityField field="aquifer.dispersivity.longitudinal" dimension="length" value={disp.longitudinal}
              onChange={(q) => updateCase((d) => d.aquifer.dispersivity.mode === 'given' && void (d.aquifer.dispersivity.longitudinal = q))} />
            <QuantityField field="aquifer.dispersivity.transverse" dimension="length" value={disp.transverse}
              onChange={(q) => updateCase((d) => d.aquifer.dispersivity.mode === 'given' && void (d.aquifer.dispersivity.transverse = q))} />
            <QuantityField field="aquifer.dispersivity.vertical" dimension="length" value={disp.vertical}
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
            <QuantityField field="aquifer.diffusion.freeWater" dimension="diffusion" value={a.diffusion.freeWater}
              onChange={(q) => updateCase((d) => void (d.aquifer.diffusion.freeWater = q))}
              help="Small organic molecules in water: about 1e-9 m²/s (common practice). Matters only at very slow flow." />
            <NumberField field="aquifer.diffusion.tortuosity" value={a.diffusion.tortuosity}
              onChange={(v) => updateCase((d) => void (d.aquifer.diffusion.tortuosity = v))} help="De = D₀·τ; τ between 0 and 1." />
          </>
        )}
      </div>
    </Section>
  );
}
