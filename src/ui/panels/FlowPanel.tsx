/**
 * Which way the water goes and how fast: the flow direction (an arrow and gradient, or water levels
 * in wells) and the seepage velocity that follows with the aquifer's inputs (AquiferPanel.tsx).
 */
import { choiceOptions } from '../../case/fields';
import { Fragment } from 'preact';
import { Section } from './Section';
import { currentCase, updateCase, currentResults } from '../state';
import { QuantityField, NumberField, Segmented, fmtNum } from '../fields';
import { mapTool, selectedId, lastDeleted } from '../view';
import { UndoDelete } from './ReceptorsPanel';
import type { Case, HeadReading } from '../../case/schema';
import { fmtLength, fmtVelocity } from '../format';
import { fieldIssue } from '../validity';
import { derivedForScreen } from '../evaluation';
import { BoundaryLines } from './WellInputs';

export function FlowPanel() {
  const c = currentCase.value;
  const flow = c.site.flow;
  const dv = derivedForScreen();
  const summary =
    (flow.method === 'direction'
      ? `Towards ${fmtNum(flow.azimuthDeg)}°, gradient ${fmtNum(flow.gradient)}`
      : `From ${flow.readings.length} water levels${dv ? `: towards ${fmtNum(dv.azimuthDeg, 3)}°, gradient ${fmtNum(dv.gradient, 2)}` : ''}`) +
    (dv ? `; v ${fmtVelocity(dv.v, 3)}` : '');
  return (
    <Section id="flow" title="Which way does the water go?" summary={summary}>
      <Segmented
        label="Flow from"
        value={flow.method}
        options={choiceOptions<'direction' | 'heads'>('site.flow.method')}
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
            field="site.flow.azimuthDeg"
            value={flow.azimuthDeg}
            suffix="°"
            onChange={(v) => updateCase((d) => d.site.flow.method === 'direction' && void (d.site.flow.azimuthDeg = v))}
            help="Drag the round handle at the tip of the arrow on the map to turn it."
          />
          <NumberField
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
          seepage velocity v = K·i/nₑ = <strong>{fmtVelocity(dv.v, 3)}</strong> ({fmtLength(dv.v * 365.25)}/yr), retardation
          factor R = <strong>{fmtNum(dv.R, 3)}</strong> (plume front moves at v/R).
        </p>
      )}
      <BoundaryLines />
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
      <ol class="dg-list">
        {readings.map((h, i) => (
          <Fragment key={h.id}>
          <UndoDelete what="head" at={i} />
          <li class={selectedId.value === h.id ? 'dg-selected' : ''} onClick={() => (selectedId.value = h.id)}>
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
          </Fragment>
        ))}
        <UndoDelete what="head" at={readings.length} />
      </ol>
      {fit && readings.length === 3 && <p class="dg-help">Three wells define the plane exactly (residuals 0); a fourth checks it.</p>}
    </div>
  );
}
