/**
 * How sure is it: the Monte Carlo screening of the case's uncertain inputs. Lists the
 * distributions (with their notes), the run count and seed (editable), Run / Cancel with a
 * progress bar and the time left, and per receptor the probability of reaching the limit within
 * the horizon ± its standard error, the 5th/50th/95th percentiles, and which input drives the
 * answer with the measurement that would settle it (bars: the exceedance probability when the
 * input lies in its low and in its high third). Results of an earlier case are marked out of date.
 * The deterministic results stay live while a run goes on (the run is in its own workers).
 */
import { Section } from './Section';
import { RunProgress } from '../RunProgress';
import { currentCase, updateCase } from '../state';
import { arrivalPercentiles, intervalText, pc, peakPercentiles } from '../uncertaintyFormat';
import { driverSentence, probabilisticCaution, type ReceptorUncertainty } from '../../case/uncertainty';
import { runLine } from '../uncertainInputs';
import { DistributionEditor } from './DistributionEditor';
import { UNCERTAIN_INPUTS } from '../../case/schema';
import { cancelUncertainty, caseKeyOf, startUncertainty, uncertaintyRun } from '../uncertaintyRun';
import { MAX_RUNS } from '../../core/uncertainty';


export function UncertaintyPanel() {
  const c = currentCase.value;
  const run = uncertaintyRun.value;
  const inputs = UNCERTAIN_INPUTS.filter((k) => c.uncertainty.inputs[k]);
  const has = inputs.length > 0 || c.uncertainty.headFit;
  const r = run.result;
  const stale = !!r && run.caseKey !== caseKeyOf(c);
  const summary = !has
    ? 'No input varies yet'
    : r
      ? `${r.done} of ${r.runs} realisations${stale ? ' (out of date)' : ''}`
      : `${inputs.length + (c.uncertainty.headFit ? 2 : 0)} uncertain inputs; not run yet`;
  return (
    <Section id="uncertainty" title="How sure is it?" summary={summary} class="dg-uncertainty">
      <DistributionEditor />
      {!has ? (
        <p class="dg-note">Tick at least one input above to make it uncertain; each starts from a distribution whose source is named under it.</p>
      ) : (
        <>
          <div class="dg-btn-row dg-mc-controls">
            <label>
              Realisations{' '}
              <input
                type="number"
                inputMode="numeric"
                min={1}
                max={MAX_RUNS}
                step={1}
                value={c.uncertainty.runs}
                onChange={(e) => {
                  const v = Number((e.target as HTMLInputElement).value);
                  if (Number.isFinite(v)) updateCase((d) => void (d.uncertainty.runs = v));
                }}
              />
            </label>
            <label>
              Seed{' '}
              <input
                type="number"
                inputMode="numeric"
                min={0}
                step={1}
                value={c.uncertainty.seed}
                onChange={(e) => {
                  const v = Number((e.target as HTMLInputElement).value);
                  if (Number.isFinite(v)) updateCase((d) => void (d.uncertainty.seed = v));
                }}
              />
            </label>
            {run.status === 'running' ? (
              <button type="button" onClick={cancelUncertainty}>
                Cancel
              </button>
            ) : (
              <button type="button" class="dg-on" onClick={() => startUncertainty(currentCase.peek())}>
                {r ? 'Run again' : 'Run'}
              </button>
            )}
          </div>
          {run.status === 'running' && (
            <RunProgress done={run.done} total={run.runs} what="realisations" barLabel="Realisations done" workers={run.workers} secondsLeft={run.secondsLeft} />
          )}
          {run.status === 'failed' && run.error && (
            <p class="dg-field-error" role="alert">
              {run.error}
            </p>
          )}
          {run.status === 'cancelled' && <p class="dg-note">Cancelled: the figures below are from the {run.done} realisations done.</p>}
          {r && (
            <div class={stale ? 'dg-mc-results dg-stale' : 'dg-mc-results'}>
              {stale && (
                <p class="dg-stale-note" role="status">
                  Out of date: the case changed since this run. Run again for figures that match the inputs.
                </p>
              )}
              <p class="dg-note">{runLine(r)}.</p>
              <div class="dg-table-wrap">
                <table class="dg-table">
                  <caption>Probability of reaching the limit within the horizon, and percentiles over the realisations</caption>
                  <thead>
                    <tr>
                      <th scope="col">Receptor</th>
                      <th scope="col">P(reaches limit)</th>
                      <th scope="col">Arrival 5th / 50th / 95th</th>
                      <th scope="col">Peak 5th / 50th / 95th</th>
                    </tr>
                  </thead>
                  <tbody>
                    {r.receptors.map((x) => (
                      <tr key={x.id}>
                        <th scope="row">{x.name || x.id}</th>
                        <td>
                          {pc(x.pExceed)} ± {pc(x.pExceedSE)}
                          <br />
                          <span class="dg-note">
                            {intervalText(x)}
                          </span>
                        </td>
                        <td>{arrivalPercentiles(x)}</td>
                        <td>{peakPercentiles(x)}</td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
              <h3 class="dg-mc-h">Which measurement would settle it</h3>
              {r.receptors.map((x) => (
                <Drivers key={x.id} r={x} />
              ))}
            </div>
          )}
          <p class="dg-caution">{probabilisticCaution(r?.runs ?? c.uncertainty.runs, r?.seed ?? c.uncertainty.seed)}</p>
        </>
      )}
    </Section>
  );
}

/** The strongest drivers of one receptor: a pair of bars (low third, high third) and the words. */
function Drivers({ r }: { r: ReceptorUncertainty }) {
  const top = r.drivers.filter((d) => Math.abs(d.rankCorrelation) >= 0.1).slice(0, 3);
  return (
    <div class="dg-mc-drivers">
      <h4>{r.name || r.id}</h4>
      {!top.length && <p class="dg-note">No single input moves the answer much (every rank correlation below 0.1).</p>}
      {top.map((d) => (
        <figure key={d.input} class="dg-mc-driver">
          <figcaption>
            <strong>{d.label}</strong> (rank correlation {d.rankCorrelation.toFixed(2)}): {driverSentence(d)}. To narrow it: {d.measure}.
          </figcaption>
          <div class="dg-mc-bars" aria-hidden="true">
            <span class="dg-mc-bar-label">low third</span>
            <span class="dg-mc-bar">
              <span class="dg-mc-bar-fill dg-mc-low" style={{ width: `${100 * d.pExceedLowThird}%` }} />
            </span>
            <span class="dg-mc-bar-value">{pc(d.pExceedLowThird)}</span>
            <span class="dg-mc-bar-label">high third</span>
            <span class="dg-mc-bar">
              <span class="dg-mc-bar-fill dg-mc-high" style={{ width: `${100 * d.pExceedHighThird}%` }} />
            </span>
            <span class="dg-mc-bar-value">{pc(d.pExceedHighThird)}</span>
          </div>
        </figure>
      ))}
    </div>
  );
}
