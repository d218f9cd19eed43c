/**
 * The printable report: a preview over the app with Print / Close, and the print stylesheet
 * (src/ui/print.css) that prints only the report, so the browser's "Save as PDF" makes the PDF.
 * Holds the case name, date, app version, inputs with units and sources, the site plan with
 * contours, the receptor table, breakthrough charts, warnings, assumptions and the caution.
 */
import { useEffect } from 'preact/hooks';
import { createPortal } from 'preact/compat';
import { currentCase, currentResults } from '../state';
import { prepareCase, type PreparedCase } from '../../case/prepare';
import { ASSUMPTIONS, SCREENING_CAUTION } from '../../case/caution';
import { BreakthroughChart } from '../charts/Charts';
import { fmtConc, fmtLength, fmtTime, fmtVelocity } from '../format';
import { SOLUTIONS_DIFFER_ABOVE, statusText } from '../../core/results';
import { dateTimeText, screenNumber } from '../../case/numbers';
import { kindText } from '../../case/receptorKinds';
import { saveState } from '../../app/session';
import { resultsFor } from './outputs';
import { inputRows } from './reportInputs';
import { SitePlan } from './SitePlan';
import { ReportObservations } from './ReportObservations';
import { ReportUncertainty } from './ReportUncertainty';
import { ReportWells } from './ReportWells';
import { particleCurveFor } from '../particleState';
import { APP_VERSION } from './version';
import { reportOpen } from './reportOpen';
import '../print.css';

export function ReportHost() {
  useEffect(() => {
    document.documentElement.classList.toggle('dg-report-open', reportOpen.value);
    return () => document.documentElement.classList.remove('dg-report-open');
  }, [reportOpen.value]);
  if (!reportOpen.value) return null;
  return createPortal(<ReportPreview />, document.body);
}

function ReportPreview() {
  const c = currentCase.value;
  const results = resultsFor(c, currentResults.value);
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => e.key === 'Escape' && (reportOpen.value = false);
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, []);
  return (
    <div class="dg-report-root" role="dialog" aria-label="Printable report">
      <div class="dg-report-bar">
        <button type="button" class="dg-lib-btn is-primary" disabled={!results} data-testid="print-report" onClick={() => window.print()}>
          {results ? 'Print or save as PDF' : 'Waiting for results…'}
        </button>
        <button type="button" class="dg-lib-btn" onClick={() => (reportOpen.value = false)}>
          Close
        </button>
      </div>
      <Report />
    </div>
  );
}

function safePrepare(c: ReturnType<typeof currentCase.peek>): PreparedCase | null {
  try {
    return prepareCase(c);
  } catch {
    return null;
  }
}

export function Report() {
  const c = currentCase.value;
  const results = resultsFor(c, currentResults.value);
  const prepared = safePrepare(c);
  const rows = inputRows(c, prepared);
  const saved = saveState.value;
  const printed = dateTimeText(new Date());
  const groups = [...new Set(rows.map((r) => r.group))];
  return (
    <article class="dg-report" data-testid="report" data-ready={results ? 'yes' : 'no'}>
      <header class="dg-report-head">
        <p class="dg-report-kicker">Groundwater contamination screening</p>
        <h1>{c.name}</h1>
        <dl class="dg-report-meta">
          <div>
            <dt>Printed</dt>
            <dd>{printed}</dd>
          </div>
          <div>
            <dt>Case last changed</dt>
            <dd>{dateTimeText(c.modified)}</dd>
          </div>
          <div>
            <dt>App</dt>
            <dd>Downgradient {APP_VERSION}</dd>
          </div>
          <div>
            <dt>Saved on device</dt>
            <dd>{saved.kind === 'saved' ? `yes (revision ${saved.revision})` : 'not yet'}</dd>
          </div>
          <div>
            <dt>Solution</dt>
            <dd>{c.evaluation.solution === 'domenico' ? 'Domenico (1987) approximation' : 'exact rectangular-source solution'}</dd>
          </div>
        </dl>
      </header>

      <p class="dg-report-caution" role="note">
        <strong>Caution. </strong>
        {SCREENING_CAUTION}
      </p>

      {!results && <p class="dg-report-missing">Results for the current inputs are not available (still computing, or the inputs are not valid). Only the inputs are shown.</p>}

      {results && (
        <section class="dg-report-section">
          <h2>Receptors</h2>
          <p class="dg-report-note">
            Limit {fmtConc(results.limit)} · horizon {fmtTime(results.horizon)} · plume length at the limit {results.plumeLength === null ? '— (source below the limit)' : fmtLength(results.plumeLength)}. Concentrations are averages over each screen interval.
          </p>
          {results.receptors.length === 0 ? (
            <p>No receptors in this case.</p>
          ) : (
            <table class="dg-report-table" data-testid="report-receptors">
              <thead>
                <tr>
                  <th scope="col">Receptor</th>
                  <th scope="col">Distance</th>
                  <th scope="col">Screen</th>
                  <th scope="col">Result</th>
                  <th scope="col">Reaches limit</th>
                  <th scope="col">At horizon</th>
                  <th scope="col">Peak (when)</th>
                  <th scope="col">Steady state</th>
                </tr>
              </thead>
              <tbody>
                {results.receptors.map((r) => (
                  <tr key={r.id}>
                    <th scope="row">
                      {r.name}
                      <small> ({kindText(r.kind)})</small>
                    </th>
                    <td>{fmtLength(r.distance)}</td>
                    <td>
                      {fmtLength(r.zTop)} – {fmtLength(r.zBottom)}
                    </td>
                    <td>{statusText(r.status)}</td>
                    <td>{fmtTime(r.arrival)}</td>
                    <td>{fmtConc(r.atHorizon)}</td>
                    <td>
                      {fmtConc(r.peak.c)} ({fmtTime(r.peak.t)})
                    </td>
                    <td>{fmtConc(r.steady)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
          {results.receptors.some((r) => r.alternate?.showBoth) && (
            <p class="dg-report-note" data-testid="report-other-solution">
              Where the {results.solution === 'domenico' ? 'exact solution' : 'Domenico approximation'} gives another result, or any figure
              differs by more than {SOLUTIONS_DIFFER_ABOVE * 100} %:{' '}
              {results.receptors
                .filter((r) => r.alternate?.showBoth)
                .map((r) => {
                  const a = r.alternate!;
                  return `${r.name}: ${statusText(a.status)}, reaches the limit ${a.arrival === null ? 'not within the horizon' : `after ${fmtTime(a.arrival)}`}, ${fmtConc(a.atHorizon)} at the horizon, peak ${fmtConc(a.peak.c)} (${fmtTime(a.peak.t)})`;
                })
                .join('; ')}
              .
            </p>
          )}
        </section>
      )}

      <section class="dg-report-section">
        <h2>Site plan</h2>
        <SitePlan c={c} prepared={prepared} results={results} />
      </section>

      {results && results.receptors.length > 0 && (
        <section class="dg-report-section dg-report-charts">
          <h2>Breakthrough curves</h2>
          {results.receptors.slice(0, 12).map((r) => (
            <BreakthroughChart
              key={r.id}
              name={r.name}
              times={results.curveTimes}
              values={r.curve}
              alternate={r.curveAlternate}
              solution={results.solution}
              limit={results.limit}
              arrival={r.arrival}
              horizon={results.horizon}
              concUnit={c.contaminant.limit.unit}
              particles={particleCurveFor(c, r.id, true)}
            />
          ))}
          {results.receptors.length > 12 && <p class="dg-report-note">The first 12 receptors are charted; the table and the CSV export hold all of them.</p>}
        </section>
      )}

      <ReportObservations c={c} prepared={prepared} />
      <ReportUncertainty c={c} />
      <ReportWells c={c} results={results} />

      <section class="dg-report-section">
        <h2>Inputs and their sources</h2>
        <table class="dg-report-table dg-report-inputs">
          <thead>
            <tr>
              <th scope="col">Input</th>
              <th scope="col">Value</th>
              <th scope="col">Source</th>
            </tr>
          </thead>
          {groups.map((g) => (
            <tbody key={g}>
              <tr class="dg-report-group">
                <th colSpan={3} scope="rowgroup">
                  {g}
                </th>
              </tr>
              {rows
                .filter((r) => r.group === g)
                .map((r) => (
                  <tr key={r.input}>
                    <th scope="row">{r.input}</th>
                    <td>{r.value}</td>
                    <td>{r.source}</td>
                  </tr>
                ))}
            </tbody>
          ))}
        </table>
        {results && (
          <p class="dg-report-note">
            Derived: seepage velocity v = K·i/nₑ = {fmtVelocity(results.derived.v)} · retardation factor R = {screenNumber(results.derived.R, 'ratio')} · Kd ={' '}
            {screenNumber(results.derived.kd, 'ratio')} L/kg · dispersivities αL {fmtLength(results.derived.ax)}, αT {fmtLength(results.derived.ay)}, αV{' '}
            {fmtLength(results.derived.az)} · decay rate λ = {screenNumber(results.derived.decay, 'ratio')} 1/d.
          </p>
        )}
        {c.notes && (
          <p class="dg-report-note">
            <strong>Notes: </strong>
            {c.notes}
          </p>
        )}
      </section>

      <section class="dg-report-section">
        <h2>Warnings</h2>
        {results && results.warnings.length > 0 ? (
          <ul>
            {results.warnings.map((w, i) => (
              <li key={i}>{w.message}</li>
            ))}
          </ul>
        ) : (
          <p>{results ? 'None raised for these inputs.' : 'Not available without results.'}</p>
        )}
      </section>

      <section class="dg-report-section">
        <h2>Assumptions</h2>
        <ul>
          {ASSUMPTIONS.map((a) => (
            <li key={a.id}>{a.text}</li>
          ))}
        </ul>
      </section>

      <footer class="dg-report-foot">
        <p>
          <strong>Screening only. </strong>
          {SCREENING_CAUTION}
        </p>
      </footer>
    </article>
  );
}
