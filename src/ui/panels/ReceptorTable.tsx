/**
 * The receptor table: each receptor's status against the limit, where it lies relative to the
 * plume's centreline, when it reaches the limit, the concentration at the horizon and the peak;
 * the other solution's figures beneath the chosen one's where they differ.
 */
import { selectedId } from '../view';
import { fmtConc, fmtLength, fmtTime } from '../format';
import type { Evaluation, ReceptorRow } from '../results';

const STATUS_TEXT: Record<ReceptorRow['status'], string> = {
  'reaches-limit': 'Reaches the limit within the horizon',
  'below-limit': 'Stays below the limit',
  'not-reached-in-horizon': 'Not reached within the horizon (reaches it later)',
};

/** Shown beside the chosen solution's figure when the other one differs by more than this. */
const DIFFERS = 0.05;

function Alt({ show, text }: { show: boolean; text: string }) {
  return show ? <span class="dg-alt">{text}</span> : null;
}

export function ReceptorTable({ r }: { r: Evaluation }) {
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
