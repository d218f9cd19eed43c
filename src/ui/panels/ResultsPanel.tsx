/**
 * What each receptor will see: the caution (always beside the results), the solution choice, the
 * receptor table (ReceptorTable.tsx), the charts, and every warning. Results follow the inputs; while new ones are computed the old ones stay,
 * marked as updating, and while an input is invalid they are marked as not matching the inputs.
 */
import { choiceOptions } from '../../case/fields';
import { Section } from './Section';
import { useState } from 'preact/hooks';
import { memo } from 'preact/compat';
import { currentCase, currentResults, updateCase } from '../state';
import { Segmented } from '../fields';
import { unitSystem, withUnitSystem } from '../../case/unitSystem';
import { selectedId } from '../view';
import { inputIssue } from '../validity';
import { evaluationState, evaluationError } from '../evaluation';
import { lazyPart } from '../lazy';
import { fmtLength, fmtTime, concUnit, lengthUnit } from '../format';
import { SCREENING_CAUTION, ASSUMPTIONS } from '../../case/caution';
import type { Evaluation } from '../results';
import { ReceptorTable } from './ReceptorTable';
import { toInternal } from '../../core/units';
import { currentRunFor } from '../uncertaintyState';
import { particleCurveFor } from '../particleState';

// the charts arrive after the first screen (src/ui/lazy.tsx)
const BreakthroughChart = lazyPart(() => import('../charts/Charts').then((m) => m.BreakthroughChart), 'chart');
const ProfileChart = lazyPart(() => import('../charts/Charts').then((m) => m.ProfileChart), 'chart');

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
        options={choiceOptions<'domenico' | 'exact'>('evaluation.solution')}
        onChange={(v) => updateCase((d) => void (d.evaluation.solution = v))}
      />
      <Segmented
        label="Units"
        value={unitSystem(c)}
        options={choiceOptions<'SI' | 'US'>('units.system')}
        onChange={(v) => updateCase((d) => void (d.units = withUnitSystem(d, v)))}
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
    </Section>
  );
}

/**
 * The caution's short form at the foot of the screen, in a row of its own under the map and the
 * panel (App.tsx): always in view once there are results, and never over anything they show.
 */
export function CautionStrip() {
  if (!currentResults.value) return null;
  return (
    <footer class="dg-caution-strip" data-testid="caution-strip">
      <p role="note">Screening estimate only: regulators and licensed hydrogeologists decide; your local limit governs.</p>
    </footer>
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

function Charts({ r }: { r: Evaluation }) {
  const sel = r.receptors.find((x) => x.id === selectedId.value) ?? r.receptors[0];
  const cu = concUnit();
  // the Monte Carlo bands of a run of this very case, if there is one
  const bands = sel && r.caseStamp === currentCase.value.modified ? (currentRunFor(currentCase.value)?.bands?.find((b) => b.id === sel.id) ?? null) : null;
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
          bands={bands}
          particles={sel && r.caseStamp === currentCase.value.modified ? particleCurveFor(currentCase.value, sel.id) : null}
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
