/**
 * The printed report's section on the site's monitoring data: per well the trend and point rate,
 * the attenuation rates and how far the model is from the measurements, in the same words as the
 * command line (src/case/observations-text.ts), and the measured-against-modelled scatter with
 * its named figures (the app's picture, charts/MonitoringCharts.tsx).
 */
import type { Case } from '../../case/schema';
import type { PreparedCase } from '../../case/prepare';
import { analyseObservations } from '../../case/observations';
import { OBSERVATION_TABLE_HEADER, observationLines, observationTableRows } from '../../case/observations-text';
import { ModelScatter } from '../charts/MonitoringCharts';

export function ReportObservations({ c, prepared }: { c: Case; prepared: PreparedCase | null }) {
  if (c.monitoring.results.length === 0) return null;
  const s = analyseObservations(c, prepared ?? undefined);
  const rows = observationTableRows(c, s);
  return (
    <section class="dg-report-section" data-testid="report-observations">
      <h2>Monitoring data</h2>
      {rows.length === 0 ? (
        <p>No results of {s.analyte} at the monitoring wells.</p>
      ) : (
        <WellTrendTable rows={rows} class="dg-report-table" />
      )}
      <ModelScatter c={c} summary={s} />
      {observationLines(s).map((line, i) => (
        <p class="dg-report-note" key={i}>
          {line}
        </p>
      ))}
    </section>
  );
}

/** The per-well table (header from the shared wording); used by the report and the app's panel. */
export function WellTrendTable({ rows, class: cls }: { rows: string[][]; class: string }) {
  return (
    <table class={cls}>
      <thead>
        <tr>
          {OBSERVATION_TABLE_HEADER.map((h) => (
            <th scope="col" key={h}>
              {h}
            </th>
          ))}
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r[0]}>
            <th scope="row">{r[0]}</th>
            {r.slice(1).map((cell, i) => (
              <td key={i}>{cell}</td>
            ))}
          </tr>
        ))}
      </tbody>
    </table>
  );
}
