/** What is at risk: the limit that governs, the time horizon, and the receptors on the map. */
import { Section } from './Section';
import { fmtTime } from '../format';
import { toInternal } from '../../core/units';
import { currentCase, updateCase } from '../state';
import { mapLengthUnit, positionShown, positionTyped, unitSystem } from '../../case/unitSystem';
import { QuantityField, NumberField, fmtNum, unitLabel } from '../fields';
import { mapTool, selectedId, lastDeleted } from '../view';
import { preparedCase } from '../evaluation';
import { newId, newReceptor } from '../../case/defaults';
import type { Case, ReceptorKind } from '../../case/schema';
import { KIND_LABEL } from '../../case/receptorKinds';
import { Fragment } from 'preact';
import { useEffect, useRef } from 'preact/hooks';
import { activeSiteMap } from '../map/active';
import { PumpingRateField } from './WellInputs';

export { KIND_LABEL };

/**
 * The depth fields of a receptor other than a well in its kind's words (a well has a screen, and may pump); the
 * water reaching a spring or a creek, or crossing a property line, is read over a depth interval
 * below the water table.
 */
function depthWords(kind: ReceptorKind): { top: string; bottom: string; help: string } | undefined {
  if (kind === 'well') return undefined; // a well's screen: the labels of src/case/fields.ts
  const help =
    kind === 'spring' || kind === 'surface-water'
      ? 'Groundwater reaching a spring or a creek comes mostly from the top of the aquifer: from 0 to 0 (at the water table, where the plume is strongest) is the cautious choice (common practice).'
      : 'The concentration is averaged over this interval; from 0 to 0 reads it at the water table.';
  return { top: 'Depth below water table: from', bottom: 'to', help };
}

export function ReceptorsPanel() {
  const c = currentCase.value;
  const k = c.contaminant;
  const n = c.site.receptors.length;
  const summary = `${n} receptor${n === 1 ? '' : 's'}; limit ${fmtNum(k.limit.value)} ${unitLabel(k.limit.unit)} (your local limit governs); horizon ${fmtTime(toInternal(c.evaluation.horizon.value, c.evaluation.horizon.unit))}`; // in the screen's time unit
  return (
    <Section id="risk" title="What is at risk?" summary={summary}>
      <QuantityField
        field="contaminant.limit"
        dimension="concentration"
        value={k.limit}
        onChange={(q) => updateCase((d) => void (d.contaminant.limit = q))}
        note={k.limitNote || undefined}
        help="Your local limit governs: the drinking-water or groundwater standard that applies at this site under local rules. Published limits shown with presets are examples only."
      />
      <QuantityField
        field="evaluation.horizon"
        dimension="time"
        value={c.evaluation.horizon}
        onChange={(q) => updateCase((d) => void (d.evaluation.horizon = q))}
        help="How far ahead to look: arrival, peak and status are reported within this time."
      />
      <QuantityField
        field="evaluation.depth"
        dimension="length"
        value={c.evaluation.depth}
        onChange={(q) => updateCase((d) => void (d.evaluation.depth = q))}
        help="Depth below the water table at which the plume contours are drawn (0: at the water table)."
      />
      <div class="dg-btn-row">
        <button
          type="button"
          class={mapTool.value === 'add-receptor' ? 'dg-on' : ''}
          data-action="add-receptor"
          onClick={() => (mapTool.value = mapTool.value === 'add-receptor' ? 'move' : 'add-receptor')}
        >
          {mapTool.value === 'add-receptor' ? 'Tap the map to place it…' : '+ Receptor (tap the map)'}
        </button>
      </div>
      <div class="dg-btn-row">
        <button type="button" data-action="add-receptor-downgradient" disabled={!preparedCase.value} onClick={addDowngradient}>
          + Receptor on the centreline (no map needed)
        </button>
      </div>
      {c.site.receptors.length === 0 && (
        <p class="dg-help">No receptors yet: add the wells, springs, creeks or property lines that matter.</p>
      )}
      <ol class="dg-list" data-testid="receptor-list">
        {c.site.receptors.map((r, i) => {
          const sel = selectedId.value === r.id;
          return (
            <Fragment key={r.id}>
            <UndoDelete what="receptor" at={i} />
            <li class={sel ? 'dg-selected' : ''} data-receptor={r.id}>
              <div class="dg-list-head">
                <input
                  class="dg-text dg-name"
                  aria-label={`Name of receptor ${i + 1}`}
                  value={r.name}
                  maxLength={200}
                  onFocus={() => (selectedId.value = r.id)}
                  onChange={(e) => updateCase((d) => void (d.site.receptors[i].name = (e.target as HTMLInputElement).value || `Receptor ${i + 1}`))}
                />
                <select
                  class="dg-select"
                  aria-label={`Kind of ${r.name}`}
                  value={r.kind}
                  onChange={(e) =>
                    updateCase((d) => {
                      const x = d.site.receptors[i];
                      x.kind = (e.target as HTMLSelectElement).value as ReceptorKind;
                      if (x.kind !== 'well') x.pumping = false; // only a well pumps
                    })
                  }
                >
                  {(Object.keys(KIND_LABEL) as ReceptorKind[]).map((kk) => (
                    <option value={kk} key={kk}>
                      {KIND_LABEL[kk]}
                    </option>
                  ))}
                </select>
              </div>
              <ReceptorPlace index={i} />
              <div class="dg-pair">
                <QuantityField
                  label={depthWords(r.kind)?.top}
                  field={`site.receptors[${i}].screenTop`}
                  dimension="length"
                  value={r.screenTop}
                  onChange={(q) => updateCase((d) => void (d.site.receptors[i].screenTop = q))}
                />
                <QuantityField
                  label={depthWords(r.kind)?.bottom}
                  field={`site.receptors[${i}].screenBottom`}
                  dimension="length"
                  value={r.screenBottom}
                  onChange={(q) => updateCase((d) => void (d.site.receptors[i].screenBottom = q))}
                />
              </div>
              {r.kind !== 'well' && <p class="dg-help">{depthWords(r.kind)?.help}</p>}
              {r.kind === 'well' && <label class="dg-check">
                <input
                  type="checkbox"
                  checked={r.pumping}
                  onChange={(e) => updateCase((d) => void (d.site.receptors[i].pumping = (e.target as HTMLInputElement).checked))}
                />
                <span>Pumps (a supply or extraction well)</span>
              </label>}
              {r.kind === 'well' && <PumpingRateField index={i} r={r} />}
              <div class="dg-btn-row">
                <button
                  type="button"
                  onClick={() => {
                    selectedId.value = r.id;
                    activeSiteMap()?.panToPosition(r.position);
                  }}
                >
                  Show on map
                </button>
                <button
                  type="button"
                  class="dg-danger"
                  aria-label={`Delete ${r.name}`}
                  onClick={() => {
                    lastDeleted.value = { what: 'receptor', index: i, item: structuredClone(r), caseId: c.id };
                    updateCase((d) => void d.site.receptors.splice(i, 1));
                    if (selectedId.peek() === r.id) selectedId.value = null;
                  }}
                >
                  Delete
                </button>
              </div>
            </li>
            </Fragment>
          );
        })}
        <UndoDelete what="receptor" at={c.site.receptors.length} />
      </ol>
    </Section>
  );
}

/**
 * Put back the last deleted receptor or water-level well (deleting never loses anything): a list
 * item where the deleted one was, so it is where the finger is, with the focus on its button.
 * List it before item `at` (and once at the list's end, `at` = its length).
 */
export function UndoDelete({ what, at }: { what: 'receptor' | 'head'; at: number }) {
  const d = lastDeleted.value;
  const c = currentCase.value;
  const button = useRef<HTMLButtonElement>(null);
  const shown = !!d && d.what === what && d.caseId === c.id && at === Math.min(d.index, listLength(c, what));
  useEffect(() => {
    if (!shown) return;
    button.current?.focus({ preventScroll: true });
    button.current?.scrollIntoView({ block: 'center' });
  }, [shown, d]);
  if (!shown || !d) return null;
  return (
    <li class="dg-undo" role="status" data-testid={`undo-${what}`}>
      Deleted “{d.item.name}”.{' '}
      <button
        type="button"
        ref={button}
        onClick={() => {
          lastDeleted.value = null;
          updateCase((x) => {
            if (d.what === 'receptor') x.site.receptors.splice(Math.min(d.index, x.site.receptors.length), 0, d.item);
            else if (x.site.flow.method === 'heads') x.site.flow.readings.splice(Math.min(d.index, x.site.flow.readings.length), 0, d.item);
          });
        }}
      >
        Undo
      </button>
    </li>
  );
}

function listLength(c: Case, what: 'receptor' | 'head'): number {
  return what === 'receptor' ? c.site.receptors.length : c.site.flow.method === 'heads' ? c.site.flow.readings.length : 0;
}

/** Add a receptor on the plume centreline beyond the farthest one (keyboard users need no map). */
function addDowngradient() {
  const p = preparedCase.peek();
  if (!p) return;
  const far = Math.max(0, ...p.receptors.map((r) => r.x));
  const x = Math.round(far > 0 ? far * 1.5 : Math.max(50, 10 * p.model.width));
  const id = newId();
  updateCase((d) => void d.site.receptors.push(newReceptor(p.toMap(x, 0), d.site.receptors.length, id)));
  selectedId.value = id;
}

/** Where a receptor is, in the flow frame: distance downgradient of the release and across. */
function ReceptorPlace({ index }: { index: number }) {
  const p = preparedCase.value;
  const r = p?.receptors[index];
  if (!p || !r) return null;
  const move = (x: number, y: number) => updateCase((d) => void (d.site.receptors[index].position = p.toMap(x, y)));
  // shown and typed in the case's length unit (m or ft); the flow frame is in metres
  const system = unitSystem(currentCase.value);
  const unit = mapLengthUnit(system).unit;
  return (
    <div class="dg-pair">
      <NumberField
        label="Downgradient of the release"
        field={`site.receptors[${index}].position`}
        value={positionShown(r.x, system)}
        suffix={unit}
        onChange={(x) => move(positionTyped(x, system), r.y)}
      />
      <NumberField
        label="Across the flow (left +)"
        field={`site.receptors[${index}].position`}
        value={positionShown(r.y, system)}
        suffix={unit}
        onChange={(y) => move(r.x, positionTyped(y, system))}
      />
    </div>
  );
}
