/**
 * Parts of the probabilistic screening that the "How sure is it?" panel and the printed report
 * show alike: the case's uncertain inputs in words, and the line that says how a run was made
 * (enough to reproduce it).
 */
import type { Case } from '../case/schema';
import { UNCERTAIN_INPUTS } from '../case/schema';
import { describeShown, INPUT_DEFINITIONS, type UncertaintyResult } from '../case/uncertainty';

/** The uncertain inputs of a case with their distributions (in the case's units) and notes; the head-fit option last. */
export function UncertainInputsList({ c }: { c: Case }) {
  const inputs = UNCERTAIN_INPUTS.filter((k) => c.uncertainty.inputs[k]);
  return (
    <ul class="dg-mc-inputs">
      {inputs.map((k) => {
        const d = c.uncertainty.inputs[k]!;
        return (
          <li key={k}>
            <strong>{INPUT_DEFINITIONS[k].label}</strong>: {describeShown(c, k, d)}
            {d.note ? <span class="dg-note"> — {d.note}</span> : null}
          </li>
        );
      })}
      {c.uncertainty.headFit && (
        <li>
          <strong>flow direction and gradient</strong>: from the least-squares covariance of the plane fitted to the head readings (understated with few readings)
        </li>
      )}
    </ul>
  );
}

/** "2000 realisations, seed 1, Latin hypercube; Domenico (1987); 3 realisations physically invalid, left out" */
export function runLine(r: UncertaintyResult): string {
  const partial = r.done < r.runs ? ` of ${r.runs} (partial)` : '';
  const solution = r.solution === 'exact' ? 'exact rectangular-source solution' : 'Domenico (1987)';
  const refused = r.refusedCount
    ? `; ${r.refusedCount} realisation${r.refusedCount === 1 ? '' : 's'} physically invalid and left out (e.g. ${r.refusals[0]?.message ?? ''})`
    : '';
  return `${r.done} realisations${partial}, seed ${r.seed}, Latin hypercube; ${solution}${refused}`;
}
