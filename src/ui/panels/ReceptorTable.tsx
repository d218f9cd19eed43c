/**
 * The receptor table: each receptor's status against the limit, where it lies relative to the
 * plume's centreline, when it reaches the limit, the concentration at the horizon and the peak;
 * the other solution's figures beneath the chosen one's wherever the two differ (core compareSolutions).
 */
import { useEffect, useRef } from 'preact/hooks';
import { revealRequest, selectedId } from '../view';
import { fmtConc, fmtLength, fmtTime } from '../format';
import type { Evaluation, ReceptorRow } from '../results';
import { SOLUTIONS_DIFFER_ABOVE, statusText } from '../../core/results';
import { ScrollX } from '../ScrollX';
import { currentCase } from '../state';
import { particleCaseKey, particleRun } from '../particleState';


const SOLUTION_SHORT: Record<'domenico' | 'exact', string> = { domenico: 'Domenico', exact: 'exact' };

/**
 * The other solution's figure under the chosen one's, for a receptor whose solutions differ under
 * the one rule (core SOLUTIONS_DIFFER_ABOVE): every figure of such a receptor, those that differ
 * in bold.
 */
function Alt({ alt, figure, text }: { alt: ReceptorRow['alternate']; figure: 'arrival' | 'atHorizon' | 'peak'; text: string }) {
  if (!alt?.showBoth) return null;
  const strong = alt.differing.includes(figure) || (figure === 'peak' && alt.differing.includes('peakTime'));
  return (
    <span class={`dg-alt${strong ? ' dg-alt-differs' : ''}`}>
      {SOLUTION_SHORT[alt.solution]}: {text}
    </span>
  );
}

const arrivalText = (a: number | null) => (a === null ? 'not within horizon' : fmtTime(a));

/** A pumping well's capture of the release (well field; see WellsPanel), under its name. */
function Capture({ r, id }: { r: Evaluation; id: string }) {
  const x = r.wells?.captures.find((c) => c.receptorId === id);
  if (!x) return null;
  return (
    <span class="dg-alt" data-col="capture">
      {x.capturesSource
        ? `Release in its capture zone: contaminant arrives in about ${fmtTime(x.travelTimeFromSource)} (advective; water ${fmtTime(x.waterTravelTime)})`
        : 'Release outside its capture zone'}
    </span>
  );
}

/** The particle figure under the analytical one, when a run for these inputs has figures. */
function Particles({ id, figure }: { id: string; figure: 'horizon' | 'arrival' }) {
  const run = particleRun.value;
  if (!run.receptors || run.caseKey !== particleCaseKey(currentCase.value)) return null;
  const x = run.receptors.find((p) => p.id === id);
  if (!x) return null;
  const partial = run.status !== 'done' ? ' (partial)' : '';
  return (
    <span class="dg-alt" data-col={`particles-${figure}`}>
      Particles{partial}:{' '}
      {figure === 'horizon' ? `${fmtConc(x.concentrationAtHorizon)} ± ${fmtConc(x.standardError)}` : x.arrival === null ? 'not within horizon' : `about ${fmtTime(x.arrival)}`}
    </span>
  );
}

export function ReceptorTable({ r }: { r: Evaluation }) {
  const reveal = revealRequest.value;
  const body = useRef<HTMLTableSectionElement>(null);
  useEffect(() => {
    // a receptor tapped on the map: its row comes into view (the panel or page scrolls the least it can)
    if (!reveal) return;
    const row = body.current?.querySelector<HTMLElement>(`tr[data-receptor="${CSS.escape(reveal.id)}"]`);
    row?.scrollIntoView({ block: 'nearest', inline: 'start' });
  }, [reveal]);
  if (r.receptors.length === 0) return <p class="dg-help">Add receptors on the map to see what each one will see.</p>;
  const otherName = r.solution === 'domenico' ? 'exact' : 'Domenico';
  const run = particleRun.value;
  const particles = !!run.receptors && run.caseKey === particleCaseKey(currentCase.value);
  return (
    <>
      {/* the table's description stays above its sideways scroll; the caption names the table */}
      <p class="dg-table-note" id="dg-receptor-table-note">
        Each receptor against the limit {fmtConc(r.limit)} over {fmtTime(r.horizon)}. Where the {otherName} solution gives another
        result, or any figure differs by more than {SOLUTIONS_DIFFER_ABOVE * 100} %, its figures are shown under the chosen one's. Method: analytical (
        {r.solution === 'domenico' ? 'Domenico 1987' : 'exact rectangular source'}, uniform flow, no pumping).
        {r.wells ? ' Pumping wells: capture of the release from the steady well field.' : ''}
        {particles
          ? ` Particles: random walk in the well field, ${run.particles.toLocaleString('en')} particles, seed ${run.seed}, depth-averaged, ± one standard error.`
          : ''}
      </p>
      <ScrollX label="Receptor results table">
        <table class="dg-table dg-receptor-table" data-testid="receptor-table" aria-describedby="dg-receptor-table-note">
          <caption class="dg-sr">Receptor results</caption>
          <thead>
            <tr>
              <th scope="col">Receptor and status</th>
              <th scope="col">Down / off the centreline</th>
              <th scope="col">Reaches limit</th>
              <th scope="col">At horizon</th>
              <th scope="col">Peak (when)</th>
            </tr>
          </thead>
          <tbody ref={body}>
            {r.receptors.map((x) => {
              const alt = x.alternate?.showBoth ? x.alternate : null;
              const upgradient = x.x < 0;
              return (
                <tr
                  key={x.id}
                  data-receptor={x.id}
                  data-status={x.status}
                  data-both={alt ? 'true' : undefined}
                  class={selectedId.value === x.id ? 'dg-selected' : ''}
                  onClick={() => (selectedId.value = x.id)}
                >
                  <th scope="row">
                    <button type="button" class="dg-linkish" onClick={() => (selectedId.value = x.id)}>
                      {x.name}
                    </button>
                    <span class={`dg-status dg-status-${x.status}`}>{upgradient ? 'Upgradient of the source: not reached' : statusText(x.status, true)}</span>
                    {alt && (
                      <span class={`dg-alt dg-status dg-status-${alt.status}${alt.status !== x.status ? ' dg-alt-differs' : ''}`} data-col="alt-status">
                        {SOLUTION_SHORT[alt.solution]}: {statusText(alt.status, true)}
                      </span>
                    )}
                    <Capture r={r} id={x.id} />
                  </th>
                  <td>
                    {upgradient ? (
                      <>{fmtLength(-x.x)} upgradient</>
                    ) : (
                      <>{fmtLength(x.x)} down</>
                    )}
                    <span class="dg-alt">{fmtLength(Math.abs(x.y))} off</span>
                  </td>
                  <td data-col="arrival">
                    {upgradient ? 'never (upgradient)' : arrivalText(x.arrival)}
                    <Alt alt={alt} figure="arrival" text={arrivalText(alt?.arrival ?? null)} />
                    <Particles id={x.id} figure="arrival" />
                  </td>
                  <td data-col="horizon">
                    {upgradient ? '—' : fmtConc(x.atHorizon)}
                    <Alt alt={alt} figure="atHorizon" text={fmtConc(alt?.atHorizon ?? 0)} />
                    <Particles id={x.id} figure="horizon" />
                  </td>
                  <td data-col="peak">
                    {upgradient ? '—' : `${fmtConc(x.peak.c)} (${fmtTime(x.peak.t)})`}
                    <Alt alt={alt} figure="peak" text={`${fmtConc(alt?.peak.c ?? 0)} (${fmtTime(alt?.peak.t ?? null)})`} />
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </ScrollX>
    </>
  );
}
