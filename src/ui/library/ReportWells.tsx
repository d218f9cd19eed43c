/**
 * The printed report's section on pumping wells and particles: per pumping well whether the
 * release lies in its capture zone and the travel time from it (method: steady well field), the
 * particle figures of a complete run for this very case with their standard errors, particle count
 * and seed (and the command that repeats them), and the well-field assumptions. Absent when the
 * case models no well field and no particle run belongs to it.
 */
import type { Case } from '../../case/schema';
import type { Evaluation } from '../results';
import { WELL_FIELD_ASSUMPTIONS } from '../../case/caution';
import { particleRunFor } from '../particleState';
import { fmtConc, fmtLength, fmtRate, fmtTime } from '../format';
import { formatSig } from '../../case/numbers';

export function ReportWells({ c, results }: { c: Case; results: Evaluation | null }) {
  const w = results?.wells ?? null;
  const particles = particleRunFor(c, true);
  if (!w && !particles) return null;
  const name = (id: string) => c.site.receptors.find((r) => r.id === id)?.name ?? id;
  return (
    <section class="dg-report-section" data-testid="report-wells">
      <h2>Pumping wells and particles</h2>
      {w && (
        <>
          <p>
            Method: steady two-dimensional well field (uniform flow plus the pumping wells and boundary lines by superposition and image wells),
            saturated thickness {fmtLength(w.thickness)}; travel times are advective, along the flow from the release.
          </p>
          <table class="dg-report-table">
            <thead>
              <tr>
                <th scope="col">Pumping well</th>
                <th scope="col">Rate</th>
                <th scope="col">Release in its capture zone</th>
                <th scope="col">Contaminant travel (water)</th>
              </tr>
            </thead>
            <tbody>
              {w.captures.map((x) => (
                <tr key={x.receptorId}>
                  <th scope="row">{name(x.receptorId)}</th>
                  <td>{fmtRate(x.rate)}</td>
                  <td>
                    {x.capturesSource ? 'yes' : 'no'} ({formatSig(100 * x.sourceShare)} % of the source width)
                  </td>
                  <td>{x.travelTimeFromSource === null ? '—' : `${fmtTime(x.travelTimeFromSource)} (${fmtTime(x.waterTravelTime)})`}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </>
      )}
      {particles ? (
        <>
          <p>
            Method: particles (random walk in the well field, {particles.particles} particles, seed {particles.seed}), depth-averaged over the
            saturated thickness; ± one standard error. Repeat with{' '}
            <code>
              npm run screen -- case.json --method particles --particles {particles.particles} --seed {particles.seed}
            </code>
            .
          </p>
          <table class="dg-report-table">
            <thead>
              <tr>
                <th scope="col">Receptor</th>
                <th scope="col">At horizon (particles)</th>
                <th scope="col">Reaches limit (particles)</th>
                <th scope="col">Estimator</th>
              </tr>
            </thead>
            <tbody>
              {particles.receptors!.map((x) => (
                <tr key={x.id}>
                  <th scope="row">{x.name}</th>
                  <td>
                    {fmtConc(x.concentrationAtHorizon)} ± {fmtConc(x.standardError)}
                  </td>
                  <td>{x.arrival === null ? 'not within horizon' : fmtTime(x.arrival)}</td>
                  <td>{x.estimator}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </>
      ) : (
        <p>No complete particle run for these inputs: the figures above are from the well field alone.</p>
      )}
      <p>What these figures assume, beyond the screening assumptions:</p>
      <ul>
        {WELL_FIELD_ASSUMPTIONS.map((a) => (
          <li key={a.id}>{a.text}</li>
        ))}
      </ul>
    </section>
  );
}
