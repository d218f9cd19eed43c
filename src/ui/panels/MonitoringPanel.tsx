/**
 * The site's monitoring data: release date, CSV import with a column-mapping step, per-well trend
 * verdicts and rates, how far the model is from the measurements, and a fit whose values can be
 * adopted as a what-if variant (never into the open case). The figures and their wording come from
 * src/case (observations.ts, observations-text.ts, fit.ts), the same as the report and the CLI.
 */
import { decodeText } from '../../case/text';
import { useEffect, useMemo, useState } from 'preact/hooks';
import { Section } from './Section';
import { currentCase, updateCase } from '../state';
import { analyseObservations } from '../../case/observations';
import { fitLines, observationLines, observationTableRows } from '../../case/observations-text';
import {
  COLUMN_ROLES,
  ROLE_LABELS,
  applyImport,
  guessMapping,
  importObservations,
  readObservationTable,
  type ColumnMapping,
  type DateOrder,
  type ObservationTable,
} from '../../case/observations-import';
import { FIT_LABELS, FIT_PARAMETERS, adoptBiodegradationAsVariant, adoptFitAsVariant, type FitParameter, type FitProgress, type FitResult } from '../../case/fit';
import { startFit, FitCancelled, type FitRun } from '../fitRun';
import { formatSig } from '../../case/numbers';
import { fromInternal, UNITS } from '../../core/units';
import { openVariant } from '../../app/actions';
import { newId } from '../../case/defaults';
import { WellTrendTable } from '../library/ReportObservations';
import { MonitoringWells } from './MonitoringWells';
import { lazyPart } from '../lazy';
import type { Case } from '../../case/schema';
import type { ObservationSummary } from '../../case/observations';

const ModelScatter = lazyPart(() => import('../charts/MonitoringCharts').then((m) => m.ModelScatter), 'chart');

export function MonitoringPanel() {
  const c = currentCase.value;
  const m = c.monitoring;
  const summary = m.results.length || m.wells.length ? `${m.wells.length} monitoring well${m.wells.length === 1 ? '' : 's'}, ${m.results.length} result${m.results.length === 1 ? '' : 's'}` : 'no monitoring data yet';
  const analysis = useMemo(() => (m.wells.length || m.results.length ? analyseObservations(c) : null), [c]);
  return (
    <Section id="monitoring" title="What was measured?" summary={summary}>
      <label class="dg-field">
        <span>Release began (the model's time zero)</span>
        <input
          type="date"
          value={m.releaseDate ?? ''}
          onChange={(e) => {
            const v = (e.target as HTMLInputElement).value;
            updateCase((d) => void (d.monitoring.releaseDate = /^\d{4}-\d{2}-\d{2}$/.test(v) ? v : null));
          }}
        />
      </label>
      <MonitoringWells summary={analysis} />
      <ImportStep />
      {m.results.length > 0 && analysis && <Summary c={c} s={analysis} />}
      {m.results.length > 0 && <FitStep />}
    </Section>
  );
}

function ImportStep() {
  const [table, setTable] = useState<ObservationTable | null>(null);
  const [mapping, setMapping] = useState<ColumnMapping | null>(null);
  const [order, setOrder] = useState<DateOrder>('auto');
  const [message, setMessage] = useState<string | null>(null);
  const c = currentCase.value;
  const onFile = async (input: HTMLInputElement) => {
    const f = input.files?.[0];
    input.value = '';
    if (!f) return;
    if (f.size > 5 * 1024 * 1024) {
      setMessage(`The file is ${(f.size / 1024 / 1024).toFixed(1)} MB, larger than the 5.0 MB accepted for one import; split it.`);
      return;
    }
    const decoded = decodeText(new Uint8Array(await f.arrayBuffer()));
    if (!decoded.ok) {
      setMessage(`Not imported: ${decoded.error}.`);
      setTable(null);
      return;
    }
    const t = readObservationTable(decoded.text);
    if (!t.ok) {
      setMessage(`Not imported: ${t.problem}.`);
      setTable(null);
      return;
    }
    setMessage(null);
    setTable(t.table);
    setMapping(guessMapping(t.table.header));
  };
  const preview = table && mapping ? importObservations(table, mapping, c.monitoring, { dateOrder: order }) : null;
  return (
    <div class="dg-monitoring-import">
      <label class="dg-field">
        <span>Import sampling results (CSV)</span>
        <input type="file" accept=".csv,text/csv,text/plain" data-testid="observations-file" onChange={(e) => onFile(e.target as HTMLInputElement)} />
      </label>
      {message && (
        <p class="dg-field-error" role="alert">
          {message}
        </p>
      )}
      {table && mapping && preview && (
        <fieldset class="dg-mapping" data-testid="observations-mapping">
          <legend>Which column holds what</legend>
          {COLUMN_ROLES.map((role) => (
            <label class="dg-field" key={role}>
              <span>{ROLE_LABELS[role]}</span>
              <select
                value={mapping[role] === null ? '' : String(mapping[role])}
                onChange={(e) => {
                  const v = (e.target as HTMLSelectElement).value;
                  setMapping({ ...mapping, [role]: v === '' ? null : Number(v) });
                }}
              >
                <option value="">— none —</option>
                {table.header.map((h, i) => (
                  <option value={String(i)} key={i}>
                    {h || `column ${i + 1}`}
                  </option>
                ))}
              </select>
            </label>
          ))}
          <label class="dg-field">
            <span>Dates like 03/04/2024</span>
            <select value={order} onChange={(e) => setOrder((e.target as HTMLSelectElement).value as DateOrder)}>
              <option value="auto">as the file shows</option>
              <option value="dmy">day first</option>
              <option value="mdy">month first</option>
            </select>
          </label>
          {preview.fatal ? (
            <p class="dg-field-error" role="alert">
              {preview.fatal}
            </p>
          ) : (
            <p class="dg-note" data-testid="observations-preview">
              {preview.results.length} results ready{preview.newWells.length ? `, ${preview.newWells.length} new wells (place them on the map by their coordinates or edit later)` : ''}
              {preview.problems.length ? `; ${preview.problems.length} rows will be skipped:` : '.'}
            </p>
          )}
          {preview.problems.length > 0 && (
            <ul class="dg-import-problems">
              {preview.problems.slice(0, 20).map((p) => (
                <li key={p.line}>
                  line {p.line}: {p.message}
                </li>
              ))}
              {preview.problems.length > 20 && <li>… and {preview.problems.length - 20} more</li>}
            </ul>
          )}
          {preview.notes.map((n) => (
            <p class="dg-note" key={n}>
              {n}
            </p>
          ))}
          <div class="dg-btn-row">
            <button
              type="button"
              class="dg-on"
              data-testid="observations-accept"
              disabled={!!preview.fatal || preview.results.length === 0}
              onClick={() => {
                updateCase((d) => void (d.monitoring = applyImport(d.monitoring, preview)));
                setTable(null);
                setMessage(`Imported ${preview.results.length} results.`);
              }}
            >
              Import {preview.results.length} results
            </button>
            <button type="button"  onClick={() => setTable(null)}>
              Cancel
            </button>
          </div>
        </fieldset>
      )}
    </div>
  );
}

function Summary({ c, s }: { c: Case; s: ObservationSummary }) {
  const rows = observationTableRows(c, s);
  return (
    <div class="dg-monitoring-summary" data-testid="observations-summary">
      <div class="dg-table-scroll" tabIndex={0} role="region" aria-label="Trend and rates per monitoring well">
        <WellTrendTable rows={rows} class="dg-table" />
      </div>
      <ModelScatter c={c} summary={s} />
      {observationLines(s).map((l, i) => (
        <p class="dg-note" key={i}>
          {l}
        </p>
      ))}
      <AdoptRate c={c} s={s} />
    </div>
  );
}

function FitStep() {
  const c = currentCase.value;
  const [chosen, setChosen] = useState<FitParameter[]>(['sourceConcentration', 'halfLife']);
  const [fit, setFit] = useState<{ result: FitResult; caseStamp: string } | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [running, setRunning] = useState<{ run: FitRun; started: number; progress: FitProgress | null } | null>(null);
  const [withIntervals, setWithIntervals] = useState(true);
  const current = fit && fit.caseStamp === c.modified ? fit.result : null;
  useEffect(() => () => running?.run.cancel(), [running?.run]);
  const start = () => {
    setError(null);
    const stamp = c.modified;
    const started = performance.now();
    const run = startFit(c, chosen, (progress) => setRunning((r) => (r && r.run === run ? { ...r, progress } : r)));
    setRunning({ run, started, progress: null });
    run.done.then(
      (result) => {
        setFit({ result, caseStamp: stamp });
        setRunning(null);
      },
      (e: Error) => {
        setRunning((r) => (r && r.run === run ? null : r));
        if (!(e instanceof FitCancelled)) setError(e.message);
        else setError('Fit cancelled; nothing was changed.');
      },
    );
  };
  return (
    <fieldset class="dg-fit" data-testid="fit">
      <legend>Fit the model to the measurements</legend>
      {FIT_PARAMETERS.map((p) => (
        <label class="dg-check" key={p}>
          <input
            type="checkbox"
            checked={chosen.includes(p)}
            disabled={!!running}
            onChange={(e) => setChosen((e.target as HTMLInputElement).checked ? [...chosen, p] : chosen.filter((x) => x !== p))}
          />{' '}
          {FIT_LABELS[p]}
        </label>
      ))}
      <div class="dg-btn-row">
        {running ? (
          <button type="button" data-testid="fit-cancel" onClick={() => running.run.cancel()}>
            Cancel the fit
          </button>
        ) : (
          <button type="button" data-testid="fit-run" disabled={chosen.length === 0} onClick={start}>
            Fit
          </button>
        )}
      </div>
      {running && <FitProgressLine started={running.started} progress={running.progress} />}
      {error && (
        <p class={error.startsWith('Fit cancelled') ? 'dg-note' : 'dg-field-error'} role={error.startsWith('Fit cancelled') ? 'status' : 'alert'}>
          {error}
        </p>
      )}
      {current && (
        <div data-testid="fit-result">
          {fitLines(current, c).map((l, i) => (
            <p class="dg-note" key={i}>
              {l}
            </p>
          ))}
          <label class="dg-check">
            <input type="checkbox" checked={withIntervals} data-testid="fit-with-intervals" onChange={(e) => setWithIntervals((e.target as HTMLInputElement).checked)} />
            <span>Carry the fitted values' standard errors into “How sure is it?” as distributions of these inputs (the data's scatter only: a lower bound)</span>
          </label>
          <div class="dg-btn-row">
            <button
              type="button"
              class="dg-on"
              data-testid="fit-adopt"
              onClick={() => void openVariant(adoptFitAsVariant(c, current, newId(), new Date().toISOString(), withIntervals))}
            >
              Adopt the fitted values as a what-if variant
            </button>
          </div>
          <p class="dg-help">The variant opens as a new case; this case stays as it is.</p>
        </div>
      )}
    </fieldset>
  );
}

/** How far the fit has gone: least-squares rounds (at most 9), model evaluations, time taken and an upper estimate of the time left. */
function FitProgressLine({ started, progress }: { started: number; progress: FitProgress | null }) {
  const [, tick] = useState(0);
  useEffect(() => {
    const t = setInterval(() => tick((n) => n + 1), 500);
    return () => clearInterval(t);
  }, []);
  const elapsed = (performance.now() - started) / 1000;
  const round = progress?.round ?? 1;
  const max = progress?.maxRounds ?? 9;
  // rounds usually stop early, when the fit stops moving; the left time assumes every round runs
  const left = progress ? (elapsed / Math.max(round - 0.5, 0.5)) * (max - round + 0.5) : null;
  return (
    <div class="dg-mc-progress" role="status" data-testid="fit-progress">
      <progress max={max} value={round - 0.5} aria-label="Fit progress" />
      <span>
        Fitting: round {round} of at most {max}, {progress?.evaluations ?? 0} model evaluations, {elapsed.toFixed(0)} s
        {left !== null && left > 1 ? `; at most about ${Math.ceil(left)} s left` : ''}
      </span>
    </div>
  );
}

/** Adopt the Buscheck & Alcantar biodegradation rate as the half-life of a what-if variant. */
function AdoptRate({ c, s }: { c: Case; s: ObservationSummary }) {
  const [withInterval, setWithInterval] = useState(true);
  if (!s.biodegradationRate || s.adoptableHalfLife === null) return null;
  const unit = c.contaminant.halfLife?.unit ?? 'yr';
  const shown = `${formatSig(fromInternal(s.adoptableHalfLife, unit), 3)} ${UNITS[unit]?.label ?? unit}`;
  return (
    <div class="dg-adopt-rate" data-testid="adopt-rate">
      <p class="dg-note">
        The biodegradation rate gives a half-life of <strong>{shown}</strong> (the case has{' '}
        {c.contaminant.halfLife ? `${formatSig(c.contaminant.halfLife.value, 4)} ${UNITS[c.contaminant.halfLife.unit]?.label ?? c.contaminant.halfLife.unit}` : 'no decay'}). A bulk attenuation rate or a point decay rate is not a
        biodegradation rate; this one assumes a steady plume and a constant source.
      </p>
      {s.biodegradationRate.interval && s.biodegradationRate.interval[0] > 0 && (
        <label class="dg-check">
          <input type="checkbox" checked={withInterval} onChange={(e) => setWithInterval((e.target as HTMLInputElement).checked)} />
          <span>Carry its interval into “How sure is it?” as the half-life's distribution</span>
        </label>
      )}
      <div class="dg-btn-row">
        <button
          type="button"
          data-testid="adopt-rate-button"
          onClick={() => void openVariant(adoptBiodegradationAsVariant(c, s, newId(), new Date().toISOString(), withInterval))}
        >
          Use this half-life in a what-if variant
        </button>
      </div>
    </div>
  );
}
