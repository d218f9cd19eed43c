/**
 * The progress line of a long seeded run (realisations, particles): a progress bar, how many are
 * done of how many on how many workers, and the time left once it can be estimated.
 */
export function RunProgress(props: { done: number; total: number; what: string; barLabel: string; workers: number; secondsLeft: number | null; testId?: string; count?: (n: number) => string }) {
  const { done, total, what, barLabel, workers, secondsLeft, testId, count = String } = props;
  return (
    <div class="dg-mc-progress" role="status" data-testid={testId}>
      <progress max={total} value={done} aria-label={barLabel} />
      <span>
        {count(done)} of {count(total)} {what} on {workers} worker{workers === 1 ? '' : 's'}
        {secondsLeft !== null ? `, about ${Math.max(1, Math.round(secondsLeft))} s left` : ''}
      </span>
    </div>
  );
}
