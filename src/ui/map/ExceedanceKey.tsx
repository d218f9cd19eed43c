/**
 * The key of the probability-of-exceedance contours on the map (exceedanceLayer.ts): what the
 * lines are, at which time and depth, from how many realisations, with their Monte Carlo standard
 * error and the caution that goes with every probabilistic figure. Shown only while the contours are.
 */
import { currentCase } from '../state';
import { currentRunFor } from '../uncertaintyState';
import { fmtTime, fmtLength } from '../format';

export function ExceedanceKey() {
  const c = currentCase.value;
  const run = currentRunFor(c);
  const m = run?.map;
  if (!run?.result || !m) return null;
  const when = m.time === Infinity ? 'at steady state' : `after ${fmtTime(m.time)}`;
  const se = (100 * m.maxStandardError).toFixed(1);
  return (
    <div class="dg-plume-key dg-pexceed-key" aria-label="Probability contours legend" data-testid="exceedance-key">
      <strong>Probability the limit is exceeded {when} (Monte Carlo, seed {run.result.seed}):</strong>
      <ul>
        {m.levels.map((level, k) => (
          <li key={level}>
            <svg class="dg-pexceed-swatch" viewBox="0 0 24 8" aria-hidden="true">
              <line x1="1" y1="4" x2="23" y2="4" class={`dg-pexceed dg-pexceed-${k}`} />
            </svg>
            {Math.round(100 * level)} %
          </li>
        ))}
      </ul>
      <span class="dg-key-note">
        from {m.realisations} realisations{run.status === 'running' ? ' so far' : ''}; each probability ± up to {se} % (one standard error); mapped out to {fmtLength(m.extent)}{' '}
        downgradient; conditional on your distributions and the model’s assumptions, not a site-specific risk figure.
      </span>
    </div>
  );
}
