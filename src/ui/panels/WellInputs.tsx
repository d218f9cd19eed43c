/**
 * The well field's inputs, each where a hydrogeologist looks for it: the saturated thickness with
 * the aquifer (AquiferPanel), a pumping well's rate with the receptor (ReceptorsPanel), and the
 * straight boundary lines with the flow (FlowPanel), which are also drawn and dragged on the map
 * (map/wellLayers.ts, the '+ River / barrier' tool).
 */
import { currentCase, currentResults, updateCase } from '../state';
import { QuantityField, Segmented, fmtNum } from '../fields';
import { mapTool } from '../view';
import { SATURATED_THICKNESS_HELP } from '../../case/wells';
import { fieldIssue } from '../validity';
import { fmtLength } from '../format';
import type { Receptor } from '../../case/schema';
import { unitSystem } from '../../case/unitSystem';

export const BOUNDARY_KIND_LABEL: Record<'constant-head' | 'no-flow', string> = {
  'constant-head': 'River or lake shore (constant head)',
  'no-flow': 'Impermeable barrier (no flow)',
};

/** Saturated thickness B: not given (pumping not modelled) or given. */
export function SaturatedThicknessField() {
  const a = currentCase.value.aquifer;
  const given = a.saturatedThickness != null;
  return (
    <div class="dg-group" data-group="saturated-thickness">
      <Segmented
        label="Saturated thickness (for pumping wells)"
        value={given ? 'given' : 'none'}
        options={[
          { id: 'none', label: 'Not given' },
          { id: 'given', label: 'Given' },
        ]}
        onChange={(v) =>
          updateCase((d) => {
            if (v === 'none') d.aquifer.saturatedThickness = null;
            else if (d.aquifer.saturatedThickness == null) d.aquifer.saturatedThickness = unitSystem(d) === 'US' ? { value: 30, unit: 'ft' } : { value: 10, unit: 'm' };
          })
        }
      />
      {given ? (
        <QuantityField
          label="Saturated thickness B"
          field="aquifer.saturatedThickness"
          dimension="length"
          value={a.saturatedThickness!}
          onChange={(q) => updateCase((d) => void (d.aquifer.saturatedThickness = q))}
          help={`${SATURATED_THICKNESS_HELP} Heads: confined, or unconfined by Dupuit–Forchheimer.`}
        />
      ) : (
        <p class="dg-help">Without it, pumping wells and boundary lines are noted but not modelled. {SATURATED_THICKNESS_HELP}</p>
      )}
    </div>
  );
}

/** A receptor that pumps: its rate (m³/d, L/s, gal/min …), or a note that it is not modelled. */
export function PumpingRateField({ index, r }: { index: number; r: Receptor }) {
  if (!r.pumping) return null;
  // a new rate starts in the case's system (US customary: gal/min, fields.ts)
  const us = unitSystem(currentCase.value) === 'US';
  const thickness = currentCase.value.aquifer.saturatedThickness != null;
  return (
    <>
      {r.pumpingRate ? (
        <QuantityField
          label="Pumping rate"
          field={`site.receptors[${index}].pumpingRate`}
          dimension="flowRate"
          value={r.pumpingRate}
          onChange={(q) => updateCase((d) => void (d.site.receptors[index].pumpingRate = q))}
          help={`The well's steady rate (the long-run average, not the peak); a supply well for a small town pumps ${us ? 'some tens to a few hundred gal/min' : 'some hundreds to a few thousand m³/d'}.`}
        />
      ) : (
        <button type="button" onClick={() => updateCase((d) => void (d.site.receptors[index].pumpingRate = us ? { value: 100, unit: 'gpm' } : { value: 500, unit: 'm3/d' }))}>
          Give its pumping rate
        </button>
      )}
      {!thickness && (
        <p class="dg-field-warn">
          The aquifer's saturated thickness is not given, so this well's pull on the plume is not modelled: it may see the plume sooner than
          shown. Give it under “What is the ground like?”.
        </p>
      )}
    </>
  );
}

/** The straight boundary lines: kind, name, remove; drawn on the map with the '+ River / barrier' tool. */
export function BoundaryLines() {
  const c = currentCase.value;
  const lines = c.site.boundaries ?? [];
  const w = currentResults.value?.wells ?? null;
  const adding = mapTool.value === 'add-boundary';
  return (
    <div class="dg-group" data-group="boundaries">
      <h3>Rivers, shores and barriers</h3>
      <p class="dg-help">
        A straight line the pumping wells' flow cannot cross: a river or lake shore held at its stage (it can feed a well), or an impermeable
        barrier. Each line runs on beyond the two points you tap (the image-well method; Ferris et al. 1962). Needs the saturated thickness.
      </p>
      <button type="button" class={adding ? 'dg-on' : ''} data-action="add-boundary" onClick={() => (mapTool.value = adding ? 'move' : 'add-boundary')}>
        {adding ? 'Tap two points on the map…' : '+ River or barrier line (tap two points)'}
      </button>
      {fieldIssue('site.boundaries') && <p class="dg-field-error" role="alert">{fieldIssue('site.boundaries')}</p>}
      <ol class="dg-list" data-testid="boundary-list">
        {lines.map((b, i) => {
          const err = fieldIssue(`site.boundaries[${i}]`) ?? fieldIssue(`site.boundaries[${i}].points`);
          return (
            <li key={b.id} data-boundary={b.id}>
              <div class="dg-list-head">
                <input
                  class="dg-text dg-name"
                  aria-label={`Name of boundary line ${i + 1}`}
                  value={b.name}
                  maxLength={200}
                  onChange={(e) => updateCase((d) => void (d.site.boundaries![i].name = (e.target as HTMLInputElement).value || `Boundary ${i + 1}`))}
                />
                <select
                  class="dg-select"
                  aria-label={`Kind of ${b.name}`}
                  value={b.kind}
                  onChange={(e) => updateCase((d) => void (d.site.boundaries![i].kind = (e.target as HTMLSelectElement).value as 'constant-head' | 'no-flow'))}
                >
                  {(['constant-head', 'no-flow'] as const).map((k) => (
                    <option key={k} value={k}>
                      {BOUNDARY_KIND_LABEL[k]}
                    </option>
                  ))}
                </select>
              </div>
              {err && (
                <p class="dg-field-error" role="alert">
                  {err}
                </p>
              )}
              {w && b.kind === 'constant-head' && <RiverShare index={i} />}
              <div class="dg-btn-row">
                <button type="button" class="dg-danger" aria-label={`Remove ${b.name}`} onClick={() => updateCase((d) => void d.site.boundaries!.splice(i, 1))}>
                  Remove
                </button>
              </div>
            </li>
          );
        })}
      </ol>
    </div>
  );
}

/** How much of each pumping well's water comes from this constant-head line (induced infiltration). */
function RiverShare({ index }: { index: number }) {
  const w = currentResults.value?.wells;
  const c = currentCase.value;
  if (!w) return null;
  const parts = w.zones
    .map((z) => ({ name: c.site.receptors.find((r) => r.id === z.receptorId)?.name ?? z.receptorId, share: z.fromBoundary[index] ?? 0 }))
    .filter((x) => x.share > 0);
  if (!parts.length) return <p class="dg-help">No pumping well draws water from this line.</p>;
  return (
    <p class="dg-derived">
      {parts.map((x) => `${x.name} draws about ${fmtNum(100 * x.share, 2)} % of its water from it`).join('; ')} (share of the traced streamlines,
      ±{fmtNum(100 / 72, 2)} %).
    </p>
  );
}

/** The single-well closed forms beside a pumping well (Javandel & Tsang 1986). */
export function singleWellText(sw: { stagnationDistance: number; widthAtWell: number; widthFarUpgradient: number } | null): string {
  if (!sw) return '';
  return `alone in the regional flow: stagnation point ${fmtLength(sw.stagnationDistance)} downgradient, capture width ${fmtLength(sw.widthAtWell)} at the well and ${fmtLength(sw.widthFarUpgradient)} far upgradient (Javandel & Tsang 1986)`;
}
