/**
 * What each receptor will see: the caution (always beside the results), the solution choice, the
 * receptor table with both solutions where they differ by more than a few percent, the charts,
 * and every warning. Results follow the inputs; while new ones are computed the old ones stay,
 * marked as updating, and while an input is invalid they are marked as not matching the inputs.
 */
import { Section } from './Section';
import { useState } from 'preact/hooks';
import { memo } from 'preact/compat';
import { currentCase, currentResults, updateCase } from '../state';
import { Segmented } from '../fields';
import { selectedId } from '../view';
import { inputIssue } from '../validity';
import { evaluationState, evaluationError } from '../evaluation';
import { BreakthroughChart, ProfileChart } from '../charts/Charts';
import { fmtConc, fmtLength, fmtTime, concUnit, lengthUnit } from '../format';
import { SCREENING_CAUTION, ASSUMPTIONS } from '../../case/caution';
import type { Evaluation, ReceptorRow } from '../results';
import { toInternal } from '../../core/units';

const STATUS_TEXT: Record<ReceptorRow['status'], string> = {
  'reaches-limit': 'Reaches the limit within the horizon',
  'below-limit': 'Stays below the limit',
  'not-reached-in-horizon': 'Not reached within the horizon (reaches it later)',
};

export function ResultsPanel() {
  const c = currentCase.value;
  const r = currentResults.value;
  const issue = inputIssue.value;
  const stale = !!r && (r.caseStamp !== c.modified || !!issue);
  const reach = r?.receptors.filter((x) => x.status === 'reaches-limit').length ?? 0;
  const summary = r ? `${reach} of ${r.receptors.length} receptors reach the limit within the horizon (screening estimate)` : 'Computing…';
  return (
    <Section id="results" title="What will each receptor see?" summary={summary} class="dg-results" collapsible={false}>
      <Caution />
      <Segmented
        label="Solution"
        value={c.evaluation.solution}
        options={[
          { id: 'domenico', label: 'Domenico (1987, approximate)' },
          { id: 'exact', label: 'Exact rectangular source' },
        ]}
        onChange={(v) => updateCase((d) => void (d.evaluation.solution = v))}
      />
      {issue && (
        <p class="dg-banner dg-banner-error" role="alert" data-testid="input-issue">
          Results paused — {issue.message}
        </p>
      )}
      {evaluationError.value && <p class="dg-banner dg-banner-error" role="alert">{evaluationError.value}</p>}
      {!r && !issue && <p class="dg-banner" role="status">Computing…</p>}
      {r && (
        <div class={stale ? 'dg-stale' : ''} data-stale={stale} data-testid="results">
          {stale && !issue && <p class="dg-banner" role="status">Updating…</p>}
          <Summary r={r} />
          <ReceptorTableOf r={r} />
          <ChartsOf r={r} />
          <WarningsOf r={r} />
        </div>
      )}
      {r && (
        <p class="dg-caution-strip" role="note" data-testid="caution-strip">
          Screening estimate only: regulators and licensed hydrogeologists decide; your local limit governs.
        </p>
      )}
    </Section>
  );
}

/**
 * The same results, whatever plume they carry: the evaluation loop republishes them with each new
 * plume (for export and the report), and an edit re-renders this panel before its results exist;
 * neither changes the table, charts or warnings, which then skip re-rendering (they still follow
 * the signals they read themselves: selection, units).
 */
function sameResults(a: { r: Evaluation }, b: { r: Evaluation }): boolean {
  if (a.r === b.r) return true;
  const ka = Object.keys(a.r) as (keyof Evaluation)[];
  if (ka.length !== Object.keys(b.r).length) return false;
  return ka.every((k) => k === 'plume' || a.r[k] === b.r[k]);
}

function Caution() {
  const [open, setOpen] = useState(false);
  return (
    <div class="dg-caution" role="note" data-testid="caution">
      <p>
        {SCREENING_CAUTION}
      </p>
      <button type="button" aria-expanded={open} onClick={() => setOpen(!open)}>
        {open ? 'Hide assumptions' : 'Assumptions behind these figures'}
      </button>
      {open && (
        <ul class="dg-assumptions" data-testid="assumptions">
          {ASSUMPTIONS.map((a) => (
            <li key={a.id}>{a.text}</li>
          ))}
        </ul>
      )}
    </div>
  );
}

function Summary({ r }: { r: Evaluation }) {
  const pl = { atViewTime: r.plumeLength, steady: r.plumeLengthSteady };
  const when = r.viewTime === Infinity ? 'at steady state' : `after ${fmtTime(r.viewTime)}`;
  return (
    <p class="dg-summary" data-testid="summary">
      {pl.atViewTime === null ? (
        <>The source concentration is below the limit: no plume above the limit.</>
      ) : (
        <>
          Plume above the limit reaches <strong>{fmtLength(pl.atViewTime)}</strong> downgradient {when}
          {pl.steady !== null && r.viewTime !== Infinity ? <> ({fmtLength(pl.steady)} at steady state)</> : null}, at{' '}
          {fmtLength(currentDepth())} below the water table ({r.solution === 'domenico' ? 'Domenico approximation' : 'exact solution'}).
        </>
      )}
    </p>
  );
}

function currentDepth(): number {
  const d = currentCase.value.evaluation.depth;
  return toInternal(d.value, d.unit);
}

/** Shown beside the chosen solution's figure when the other one differs by more than this. */
const DIFFERS = 0.05;

function Alt({ show, text }: { show: boolean; text: string }) {
  return show ? <span class="dg-alt">{text}</span> : null;
}

function ReceptorTable({ r }: { r: Evaluation }) {
  if (r.receptors.length === 0) return <p class="dg-help">Add receptors on the map to see what each one will see.</p>;
  const otherName = r.solution === 'domenico' ? 'exact' : 'Domenico';
  return (
    <div class="dg-table-wrap">
      <table class="dg-table" data-testid="receptor-table">
        <caption>
          Each receptor against the limit {fmtConc(r.limit)} over {fmtTime(r.horizon)}. Where the {otherName} solution differs by more
          than {DIFFERS * 100} %, its figure is shown under the chosen one.
        </caption>
        <thead>
          <tr>
            <th scope="col">Receptor and status</th>
            <th scope="col">Down / off the centreline</th>
            <th scope="col">Reaches limit</th>
            <th scope="col">At horizon</th>
            <th scope="col">Peak (when)</th>
          </tr>
        </thead>
        <tbody>
          {r.receptors.map((x) => {
            const alt = x.alternate && x.alternate.relDiff > DIFFERS ? x.alternate : null;
            const an = alt ? (alt.solution === 'exact' ? 'exact' : 'Domenico') : '';
            return (
              <tr
                key={x.id}
                data-receptor={x.id}
                data-status={x.status}
                class={selectedId.value === x.id ? 'dg-selected' : ''}
                onClick={() => (selectedId.value = x.id)}
              >
                <th scope="row">
                  <button type="button" class="dg-linkish" onClick={() => (selectedId.value = x.id)}>
                    {x.name}
                  </button>
                  <span class={`dg-status dg-status-${x.status}`}>{STATUS_TEXT[x.status]}</span>
                </th>
                <td>
                  {fmtLength(x.x)} down
                  <span class="dg-alt">{fmtLength(Math.abs(x.y))} off</span>
                </td>
                <td data-col="arrival">
                  {x.arrival === null ? 'not within horizon' : fmtTime(x.arrival)}
                  <Alt show={!!alt} text={`${an}: ${alt?.arrival === null ? 'not within horizon' : fmtTime(alt?.arrival ?? null)}`} />
                </td>
                <td data-col="horizon">
                  {fmtConc(x.atHorizon)}
                  <Alt show={!!alt} text={`${an}: ${fmtConc(alt?.atHorizon ?? 0)}`} />
                </td>
                <td data-col="peak">
                  {fmtConc(x.peak.c)} ({fmtTime(x.peak.t)})
                  <Alt show={!!alt} text={`${an}: ${fmtConc(alt?.peak.c ?? 0)}`} />
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

function Charts({ r }: { r: Evaluation }) {
  const sel = r.receptors.find((x) => x.id === selectedId.value) ?? r.receptors[0];
  const cu = concUnit();
  return (
    <div class="dg-charts">
      {sel && (
        <BreakthroughChart
          name={sel.name}
          times={r.curveTimes}
          values={sel.curve}
          alternate={sel.curveAlternate}
          solution={r.solution}
          limit={r.limit}
          arrival={sel.arrival}
          horizon={r.horizon}
          concUnit={cu}
        />
      )}
      {r.receptors.length > 1 && (
        <div class="dg-btn-row dg-chart-pick" role="group" aria-label="Breakthrough curve for">
          {r.receptors.map((x) => (
            <button type="button" key={x.id} class={x.id === sel?.id ? 'dg-on' : ''} aria-pressed={x.id === sel?.id} onClick={() => (selectedId.value = x.id)}>
              {x.name}
            </button>
          ))}
        </div>
      )}
      <ProfileChart
        xs={r.profile.xs}
        values={r.profile.values}
        alternate={r.profile.alternate}
        solution={r.solution}
        limit={r.limit}
        time={r.profile.time}
        concUnit={cu}
        lengthUnit={lengthUnit()}
        receptors={r.receptors.map((x) => ({ name: x.name, x: x.x }))}
      />
    </div>
  );
}

function Warnings({ r }: { r: Evaluation }) {
  const all = [...r.warnings];
  if (all.length === 0) return <p class="dg-help">No warnings for these inputs.</p>;
  return (
    <div class="dg-warnings" data-testid="warnings">
      <h3>Check these ({all.length})</h3>
      <ul>
        {all.map((w, i) => (
          <li key={w.code + i} data-code={w.code}>
            {w.message}
          </li>
        ))}
      </ul>
    </div>
  );
}

const ReceptorTableOf = memo(ReceptorTable, sameResults);
const ChartsOf = memo(Charts, sameResults);
const WarningsOf = memo(Warnings, sameResults);
