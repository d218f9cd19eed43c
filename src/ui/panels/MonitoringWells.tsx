/**
 * Monitoring wells and their results, entered by hand: a well is placed by tapping the map
 * ("+ Monitoring well" tool) or by typing its coordinates; a result is a date, a value or a
 * "< limit" non-detect, a unit and the analyte. Typed text is checked before anything is stored
 * (src/case/monitoring.ts `checkResultDraft`, src/case/check.ts `positionProblem`), and the message
 * names the field and what it accepts; deleting a result or a well offers Undo (and the header's
 * undo covers every edit), so nothing stored is lost.
 *
 * The selected well (a tap on its map mark, or its button here) shows its results, its trend and
 * its measured series on the modelled breakthrough curve (charts/MonitoringCharts.tsx, loaded on
 * first use).
 */
import { useEffect, useRef, useState } from 'preact/hooks';
import { currentCase, undoEdit, updateCase } from '../state';
import { mapTool, selectedId } from '../view';
import { preparedCase } from '../evaluation';
import { QuantityField, unitLabel } from '../fields';
import { lazyPart } from '../lazy';
import { newId } from '../../case/defaults';
import { positionProblem } from '../../case/check';
import {
  checkResultDraft,
  comparedAnalyte,
  draftOf,
  indexOfResult,
  newMonitoringWell,
  resultText,
  wellSeries,
  type MonitoringWell,
  type ResultDraft,
  type SamplingResult,
} from '../../case/monitoring';
import type { ObservationSummary } from '../../case/observations';
import { unitsOf } from '../../core/units';
import { formatSig } from '../../case/numbers';
import { fmtLength } from '../format';
import { mapLengthUnit, positionShown, positionTyped, unitSystem } from '../../case/unitSystem';
import { activeSiteMap } from '../map/active';
import { showMonitoringWell } from '../map/monitoringLayer';
import type { Case } from '../../case/schema';

const WellChart = lazyPart(() => import('../charts/MonitoringCharts').then((m) => m.WellChart), 'chart');

export function MonitoringWells({ summary }: { summary: ObservationSummary | null }) {
  const c = currentCase.value;
  const wells = c.monitoring.wells;
  const sel = wells.findIndex((w) => w.id === selectedId.value);
  const adding = mapTool.value === 'add-monitoring';
  const [undo, setUndo] = useState<{ well: MonitoringWell; index: number; results: SamplingResult[]; caseId: string } | null>(null);
  const analyte = comparedAnalyte(c.monitoring, c.contaminant.name);
  return (
    <div class="dg-mwells" data-testid="monitoring-wells">
      <h3 class="dg-subhead">Monitoring wells</h3>
      <div class="dg-btn-row">
        <button type="button" class={adding ? 'dg-on' : ''} aria-pressed={adding} data-action="add-monitoring" onClick={() => (mapTool.value = adding ? 'move' : 'add-monitoring')}>
          {adding ? 'Tap the map to place it…' : '+ Monitoring well (tap the map)'}
        </button>
        <button
          type="button"
          data-action="add-monitoring-typed"
          onClick={() => {
            const id = newId();
            updateCase((d) => void d.monitoring.wells.push(newMonitoringWell(d.monitoring, null, id)));
            showMonitoringWell(id);
          }}
        >
          + Monitoring well by coordinates
        </button>
      </div>
      {undo && undo.caseId === c.id && (
        <p class="dg-undo" role="status" data-testid="undo-monitoring-well">
          Deleted “{undo.well.name}” and its {undo.results.length} result{undo.results.length === 1 ? '' : 's'}.{' '}
          <button
            type="button"
            onClick={() => {
              const u = undo;
              setUndo(null);
              updateCase((d) => {
                d.monitoring.wells.splice(Math.min(u.index, d.monitoring.wells.length), 0, u.well);
                d.monitoring.results.push(...u.results);
              });
              showMonitoringWell(u.well.id);
            }}
          >
            Undo
          </button>
        </p>
      )}
      {wells.length === 0 ? (
        <p class="dg-help">No monitoring wells yet: place them on the map, type their coordinates, or import a results table (below).</p>
      ) : (
        <div class="dg-btn-row dg-mwell-pick" role="group" aria-label="Monitoring well shown">
          {wells.map((w) => {
            const s = wellSeries(c.monitoring, w.id, analyte);
            return (
              <button type="button" key={w.id} class={w.id === selectedId.value ? 'dg-on' : ''} aria-pressed={w.id === selectedId.value} data-mwell={w.id} onClick={() => showMonitoringWell(w.id)}>
                {w.name}
                {!w.position && ' (not placed)'} · {s.length}
                <span class="dg-sr"> results</span>
              </button>
            );
          })}
        </div>
      )}
      {sel >= 0 && (
        <WellDetail
          key={wells[sel].id}
          index={sel}
          summary={summary}
          onDelete={(well, results) => {
            setUndo({ well, index: sel, results, caseId: c.id });
            selectedId.value = null;
          }}
        />
      )}
    </div>
  );
}

function WellDetail({ index, summary, onDelete }: { index: number; summary: ObservationSummary | null; onDelete: (w: MonitoringWell, r: SamplingResult[]) => void }) {
  const c = currentCase.value;
  const w = c.monitoring.wells[index];
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => ref.current?.scrollIntoView({ block: 'nearest' }), [w.id]);
  const obs = summary?.wells.find((x) => x.id === w.id) ?? null;
  const field = `monitoring.wells[${index}]`;
  return (
    <div class="dg-mwell" ref={ref} data-testid="monitoring-well" data-mwell={w.id}>
      <label class="dg-field">
        <span>Name</span>
        <input
          class="dg-text dg-name"
          value={w.name}
          maxLength={200}
          onChange={(e) => {
            const v = (e.target as HTMLInputElement).value.trim();
            updateCase((d) => void (d.monitoring.wells[index].name = v || w.name));
          }}
        />
      </label>
      <WellPlace index={index} />
      <div class="dg-pair">
        <QuantityField
          label="Screen top below water table"
          field={`${field}.screenTop`}
          dimension="length"
          value={w.screenTop}
          onChange={(q) => updateCase((d) => void (d.monitoring.wells[index].screenTop = q))}
        />
        <QuantityField
          label="Screen bottom"
          field={`${field}.screenBottom`}
          dimension="length"
          value={w.screenBottom}
          onChange={(q) => updateCase((d) => void (d.monitoring.wells[index].screenBottom = q))}
        />
      </div>
      {obs && obs.series.length > 0 && (
        <p class="dg-note" data-testid="monitoring-well-trend">
          Trend over {obs.trend.rounds} round{obs.trend.rounds === 1 ? '' : 's'}: <strong>{obs.trend.verdict}</strong>
          {obs.trend.mannKendall ? ` (Mann–Kendall S = ${obs.trend.mannKendall.s}, p = ${formatSig(obs.trend.mannKendall.p, 2)})` : ''}
          {obs.pointRate ? `; point decay rate ${formatSig(obs.pointRate.rate, 3)} /d (not a biodegradation rate)` : ''}.
        </p>
      )}
      {obs && summary && obs.series.length > 0 && <WellChart c={c} summary={summary} wellId={w.id} />}
      <ResultsList well={w} />
      <ResultEntry well={w} />
      <div class="dg-btn-row">
        {w.position && (
          <button type="button" onClick={() => activeSiteMap()?.panToPosition(w.position!)}>
            Show on map
          </button>
        )}
        <button
          type="button"
          class="dg-danger"
          aria-label={`Delete well ${w.name} and its results`}
          onClick={() => {
            const results = c.monitoring.results.filter((r) => r.wellId === w.id);
            onDelete(structuredClone(w), structuredClone(results));
            updateCase((d) => {
              d.monitoring.wells = d.monitoring.wells.filter((x) => x.id !== w.id);
              d.monitoring.results = d.monitoring.results.filter((r) => r.wellId !== w.id);
            });
          }}
        >
          Delete well
        </button>
      </div>
    </div>
  );
}

/** The well's coordinates in the case's frame, typed; placed only when both are valid. */
function WellPlace({ index }: { index: number }) {
  const c = currentCase.value;
  const w = c.monitoring.wells[index];
  const geo = c.site.frame === 'geographic';
  // a local case's east and north in the case's system (ft in a US customary case), stored in metres
  const system = unitSystem(c);
  const unit = mapLengthUnit(system).unit;
  const names = geo ? ['Longitude (°)', 'Latitude (°)'] : [`East (${unit})`, `North (${unit})`];
  const shown = (v: number | undefined) => (v === undefined ? '' : String(geo ? Number(v.toFixed(7)) : positionShown(v, system)));
  const [text, setText] = useState<[string, string]>([shown(w.position?.[0]), shown(w.position?.[1])]);
  const [error, setError] = useState<string | null>(null);
  useEffect(() => setText([shown(w.position?.[0]), shown(w.position?.[1])]), [w.position?.[0], w.position?.[1], system]);
  const p = preparedCase.value;
  let where: string | null = null;
  if (w.position && p) {
    try {
      const f = p.fromMap(w.position);
      where = `${fmtLength(f.x, 3)} downgradient of the release, ${fmtLength(f.y, 3)} across the flow (left +).`;
    } catch {
      where = null;
    }
  }
  const place = () => {
    const v = text.map((t) => Number(t.trim().replace(',', '.')));
    const bad = v.findIndex((x, i) => text[i].trim() === '' || !Number.isFinite(x));
    if (bad >= 0) {
      setError(`${names[bad]}: enter a number; accepted: ${geo ? 'longitude −180 to 180, latitude −90 to 90, within 1000 km of the site datum' : `a finite number of ${unit === 'ft' ? 'feet' : 'metres'} in the site grid`}. Nothing was changed.`);
      return;
    }
    const at: [number, number] = geo ? [v[0], v[1]] : [positionTyped(v[0], system), positionTyped(v[1], system)];
    const problem = positionProblem(c, at);
    if (problem) {
      setError(`Position: ${problem}. Nothing was changed.`);
      return;
    }
    setError(null);
    updateCase((d) => void (d.monitoring.wells[index].position = at));
  };
  return (
    <fieldset class="dg-coords" data-testid="monitoring-well-coords">
      <legend>Where it is{w.position ? '' : ' (not placed yet: type its coordinates)'}</legend>
      <div class="dg-pair">
        {names.map((n, i) => (
          <label class="dg-field" key={n}>
            <span>{n}</span>
            <input
              class="dg-num"
              type="text"
              inputMode="decimal"
              value={text[i]}
              aria-invalid={error?.startsWith(n) || error?.startsWith('Position') ? true : undefined}
              onInput={(e) => {
                const t = [...text] as [string, string];
                t[i] = (e.target as HTMLInputElement).value;
                setText(t);
              }}
              onKeyDown={(e) => e.key === 'Enter' && place()}
            />
          </label>
        ))}
      </div>
      <div class="dg-btn-row">
        <button type="button" data-action="place-monitoring" onClick={place}>
          {w.position ? 'Move to these coordinates' : 'Place at these coordinates'}
        </button>
      </div>
      {error && (
        <p class="dg-field-error" role="alert">
          {error}
        </p>
      )}
      {where && <p class="dg-field-note">{where}</p>}
    </fieldset>
  );
}

/**
 * The well's stored results (every analyte), newest first, each with Edit and Delete; an Undo for
 * the last one deleted, and for the last one changed (the case's own undo step, while nothing was
 * edited after it).
 */
function ResultsList({ well }: { well: MonitoringWell }) {
  const c = currentCase.value;
  const [undo, setUndo] = useState<{ result: SamplingResult; wellId: string } | null>(null);
  const [editing, setEditing] = useState<SamplingResult | null>(null);
  const [changed, setChanged] = useState<{ before: SamplingResult; after: SamplingResult; stamp: string } | null>(null);
  const rows = c.monitoring.results
    .map((r, i) => ({ r, i }))
    .filter((x) => x.r.wellId === well.id)
    .sort((a, b) => (a.r.date < b.r.date ? 1 : a.r.date > b.r.date ? -1 : a.r.analyte.localeCompare(b.r.analyte)));
  return (
    <div class="dg-mresults">
      {undo && undo.wellId === well.id && (
        <p class="dg-undo" role="status" data-testid="undo-result">
          Deleted the {undo.result.date} result ({resultText(undo.result)}).{' '}
          <button
            type="button"
            onClick={() => {
              const u = undo;
              setUndo(null);
              updateCase((d) => void d.monitoring.results.push(u.result));
            }}
          >
            Undo
          </button>
        </p>
      )}
      {changed && changed.after.wellId === well.id && (
        <p class="dg-undo" role="status" data-testid="changed-result">
          Changed the {changed.before.date} result: {resultText(changed.before)} → {changed.after.date !== changed.before.date ? `${changed.after.date}, ` : ''}
          {resultText(changed.after)}.{' '}
          {c.modified === changed.stamp && (
            <button
              type="button"
              onClick={() => {
                setChanged(null);
                undoEdit();
              }}
            >
              Undo
            </button>
          )}
        </p>
      )}
      {rows.length === 0 ? (
        <p class="dg-help">No results at this well yet.</p>
      ) : (
        <div class="dg-table-scroll dg-mresults-scroll" tabIndex={0} role="region" aria-label={`Results at ${well.name}`}>
          <table class="dg-table" data-testid="monitoring-results">
            <thead>
              <tr>
                <th scope="col">date</th>
                <th scope="col">analyte</th>
                <th scope="col">result</th>
                <th scope="col">
                  <span class="dg-sr">edit or delete</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {rows.map(({ r }) => (
                <tr key={`${r.date}|${r.analyte}|${r.value}|${r.nonDetect}`} class={editing && sameResult(editing, r) ? 'dg-row-editing' : undefined}>
                  <td>{r.date}</td>
                  <td>{r.analyte}</td>
                  <td>{r.nonDetect ? <span title="below the reporting limit">{resultText(r)} (not detected)</span> : resultText(r)}</td>
                  <td class="dg-row-actions">
                    <button
                      type="button"
                      class="dg-small"
                      aria-pressed={editing ? sameResult(editing, r) : false}
                      aria-label={`Edit the ${r.date} ${r.analyte} result`}
                      onClick={() => {
                        setEditing(editing && sameResult(editing, r) ? null : structuredClone(r));
                        setChanged(null);
                      }}
                    >
                      Edit
                    </button>
                    <button
                      type="button"
                      class="dg-danger dg-small"
                      aria-label={`Delete the ${r.date} ${r.analyte} result`}
                      onClick={() => {
                        setUndo({ result: structuredClone(r), wellId: well.id });
                        if (editing && sameResult(editing, r)) setEditing(null);
                        updateCase((d) => {
                          const k = indexOfResult(d.monitoring, r);
                          if (k >= 0) d.monitoring.results.splice(k, 1);
                        });
                      }}
                    >
                      Delete
                    </button>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {editing && editing.wellId === well.id && (
        <ResultEdit
          key={`${editing.date}|${editing.analyte}|${editing.value}|${editing.nonDetect}|${editing.unit}`}
          well={well}
          original={editing}
          onCancel={() => setEditing(null)}
          onSaved={(after) => {
            setEditing(null);
            setChanged({ before: editing, after, stamp: currentCase.peek().modified });
          }}
        />
      )}
    </div>
  );
}

function sameResult(a: SamplingResult, b: SamplingResult): boolean {
  return a.wellId === b.wellId && a.date === b.date && a.analyte === b.analyte && a.value === b.value && a.unit === b.unit && a.nonDetect === b.nonDetect;
}

/**
 * A stored result changed in place: the entry form's fields filled with it, checked as a whole like
 * a new one (another result on the new date is named), stored only when it passes, as one edit
 * the case's undo takes back.
 */
function ResultEdit({ well, original, onCancel, onSaved }: { well: MonitoringWell; original: SamplingResult; onCancel: () => void; onSaved: (r: SamplingResult) => void }) {
  const [draft, setDraft] = useState<ResultDraft>(() => draftOf(original));
  const [error, setError] = useState<{ field: keyof ResultDraft; message: string } | null>(null);
  const ref = useRef<HTMLFieldSetElement>(null);
  useEffect(() => {
    ref.current?.scrollIntoView({ block: 'nearest' });
    ref.current?.querySelector<HTMLInputElement>('[data-entry=value]')?.focus();
  }, []);
  const save = () => {
    const m = currentCase.peek().monitoring;
    const k = indexOfResult(m, original);
    if (k < 0) {
      setError({ field: 'date', message: 'This result is no longer stored as it was (deleted or undone meanwhile).' });
      return;
    }
    const r = checkResultDraft(m, well.id, draft, k);
    if (!r.ok) {
      setError({ field: r.field, message: r.message });
      return;
    }
    if (sameResult(r.result, original)) return onCancel();
    updateCase((d) => void (d.monitoring.results[k] = r.result));
    onSaved(r.result);
  };
  return (
    <fieldset class="dg-result-entry dg-result-edit" ref={ref} data-testid="result-edit">
      <legend>
        Change the {original.date} {original.analyte} result at {well.name}
      </legend>
      <ResultFields draft={draft} set={(patch) => setDraft({ ...draft, ...patch })} invalid={(f) => (error?.field === f ? true : undefined)} onEnter={save} />
      <div class="dg-btn-row">
        <button type="button" class="dg-on" data-action="save-result" onClick={save}>
          Save the change
        </button>
        <button type="button" data-action="cancel-edit" onClick={onCancel}>
          Cancel
        </button>
      </div>
      {error && (
        <p class="dg-field-error" role="alert" data-testid="result-edit-error">
          {error.message} Nothing was changed.
        </p>
      )}
    </fieldset>
  );
}

function lastUnit(c: Case, wellId: string): string {
  const mine = c.monitoring.results.filter((r) => r.wellId === wellId);
  const any = mine.length ? mine : c.monitoring.results;
  return any.length ? any[any.length - 1].unit : c.contaminant.limit.unit;
}

/** One result typed by hand: checked as a whole, stored only when it passes. */
function ResultEntry({ well }: { well: MonitoringWell }) {
  const c = currentCase.value;
  const [draft, setDraft] = useState<ResultDraft>(() => ({ date: '', value: '', nonDetect: false, unit: lastUnit(c, well.id), analyte: comparedAnalyte(c.monitoring, c.contaminant.name) }));
  const [error, setError] = useState<{ field: keyof ResultDraft; message: string } | null>(null);
  const [added, setAdded] = useState<string | null>(null);
  const set = (patch: Partial<ResultDraft>) => {
    setDraft({ ...draft, ...patch });
    setAdded(null);
  };
  const add = () => {
    const r = checkResultDraft(currentCase.peek().monitoring, well.id, draft);
    if (!r.ok) {
      setError({ field: r.field, message: r.message });
      return;
    }
    setError(null);
    updateCase((d) => void d.monitoring.results.push(r.result));
    setAdded(`Added ${r.result.date}: ${resultText(r.result)}.`);
    setDraft({ ...draft, date: '', value: '' });
  };
  const invalid = (f: keyof ResultDraft) => (error?.field === f ? true : undefined);
  return (
    <fieldset class="dg-result-entry" data-testid="result-entry">
      <legend>Add a result at {well.name}</legend>
      <ResultFields draft={draft} set={set} invalid={invalid} onEnter={add} />
      <div class="dg-btn-row">
        <button type="button" class="dg-on" data-action="add-result" onClick={add}>
          Add result
        </button>
      </div>
      {error && (
        <p class="dg-field-error" role="alert" data-testid="result-entry-error">
          {error.message} Nothing was stored.
        </p>
      )}
      {added && (
        <p class="dg-note" role="status">
          {added}
        </p>
      )}
    </fieldset>
  );
}

/** The fields of a result (date, analyte, non-detect, value or limit, unit), for a new one and for an edit. */
function ResultFields({
  draft,
  set,
  invalid,
  onEnter,
}: {
  draft: ResultDraft;
  set: (patch: Partial<ResultDraft>) => void;
  invalid: (f: keyof ResultDraft) => true | undefined;
  onEnter: () => void;
}) {
  return (
    <>
        <div class="dg-pair">
          <label class="dg-field">
            <span>Sampling date</span>
            <input type="date" class="dg-text" value={draft.date} aria-invalid={invalid('date')} data-entry="date" onInput={(e) => set({ date: (e.target as HTMLInputElement).value })} />
          </label>
          <label class="dg-field">
            <span>Analyte</span>
            <input class="dg-text" value={draft.analyte} maxLength={100} aria-invalid={invalid('analyte')} data-entry="analyte" onInput={(e) => set({ analyte: (e.target as HTMLInputElement).value })} />
          </label>
        </div>
        <div class="dg-pair dg-result-value">
          <label class="dg-check">
            <input type="checkbox" checked={draft.nonDetect} data-entry="nonDetect" onChange={(e) => set({ nonDetect: (e.target as HTMLInputElement).checked })} />
            <span>below the limit (“&lt;”)</span>
          </label>
          <label class="dg-field">
            <span>{draft.nonDetect ? 'Reporting limit' : 'Measured value'}</span>
            <input
              class="dg-num"
              type="text"
              inputMode="decimal"
              autoComplete="off"
              value={draft.value}
              aria-invalid={invalid('value')}
              data-entry="value"
              onInput={(e) => set({ value: (e.target as HTMLInputElement).value })}
              onKeyDown={(e) => e.key === 'Enter' && onEnter()}
            />
          </label>
          <label class="dg-field">
            <span>Unit</span>
            <select class="dg-unit" value={draft.unit} data-entry="unit" onChange={(e) => set({ unit: (e.target as HTMLSelectElement).value })}>
              {unitsOf('concentration').map((u) => (
                <option value={u.id} key={u.id}>
                  {unitLabel(u.id)}
                </option>
              ))}
            </select>
          </label>
        </div>
    </>
  );
}
