/**
 * The printed report's section on the probabilistic screening: the distributions, the seed and
 * the run count (enough to reproduce the run: the same case, seed and runs give the same figures in
 * the app and on the command line), and the results of the last run when it belongs to this very
 * case; otherwise it says the run has not been done for these inputs.
 */
import type { Case } from '../../case/schema';
import { UNCERTAIN_INPUTS } from '../../case/schema';
import { driverSentence, probabilisticCaution } from '../../case/uncertainty';
import { runLine, UncertainInputsList } from '../uncertainInputs';
import { caseKeyOf, uncertaintyRun } from '../uncertaintyRun';
import { arrivalPercentiles, intervalText, pc, peakPercentiles } from '../uncertaintyFormat';


export function ReportUncertainty({ c }: { c: Case }) {
  const inputs = UNCERTAIN_INPUTS.filter((k) => c.uncertainty.inputs[k]);
  if (!inputs.length && !c.uncertainty.headFit) return null;
  const run = uncertaintyRun.value;
  const r = run.result && run.caseKey === caseKeyOf(c) && run.status === 'done' ? run.result : null;
  return (
    <section class="dg-report-section" data-testid="report-uncertainty">
      <h2>How sure it is (Monte Carlo)</h2>
      <p>Uncertain inputs, sampled independently (correlation between inputs is not represented):</p>
      <UncertainInputsList c={c} />
      {r ? (
        <>
          <p>
            {runLine(r)}. Reproduce with{' '}
            <code>
              npm run screen -- case.json --runs {r.runs} --seed {r.seed}
            </code>
            .
          </p>
          <table class="dg-report-table">
            <thead>
              <tr>
                <th scope="col">Receptor</th>
                <th scope="col">P(reaches limit within horizon)</th>
                <th scope="col">Arrival 5th / 50th / 95th</th>
                <th scope="col">Peak 5th / 50th / 95th</th>
                <th scope="col">Strongest driver</th>
              </tr>
            </thead>
            <tbody>
              {r.receptors.map((x) => (
                <tr key={x.id}>
                  <th scope="row">{x.name || x.id}</th>
                  <td>
                    {pc(x.pExceed)} ± {pc(x.pExceedSE)} ({intervalText(x)})
                  </td>
                  <td>{arrivalPercentiles(x)}</td>
                  <td>{peakPercentiles(x)}</td>
                  <td>{x.drivers[0] ? `${x.drivers[0].label} (rank correlation ${x.drivers[0].rankCorrelation.toFixed(2)}): ${driverSentence(x.drivers[0])}. To narrow it: ${x.drivers[0].measure}.` : '—'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </>
      ) : (
        <p>
          No completed run for these inputs ({c.uncertainty.runs} realisations, seed {c.uncertainty.seed} are set). Run it under "How sure is it?" before printing, or
          on the command line: <code>npm run screen -- case.json --runs {c.uncertainty.runs} --seed {c.uncertainty.seed}</code>.
        </p>
      )}
      <p>{probabilisticCaution(r?.runs ?? c.uncertainty.runs, r?.seed ?? c.uncertainty.seed)}</p>
    </section>
  );
}
