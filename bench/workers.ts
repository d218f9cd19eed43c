/**
 * worker_threads for the benchmark's pools: `n` workers of one bundled script (beside bench.mjs
 * in dist-cli/), each sent `init` and awaited until its first reply (planned, warmed up).
 */
import { Worker } from 'node:worker_threads';

export async function startWorkers(script: string, n: number, init: unknown): Promise<Worker[]> {
  const url = new URL(`./${script}`, import.meta.url);
  const workers = Array.from({ length: n }, () => new Worker(url));
  await Promise.all(
    workers.map(
      (w) =>
        new Promise<void>((resolve, reject) => {
          w.once('message', () => resolve());
          w.once('error', reject);
          w.postMessage(init);
        }),
    ),
  );
  return workers;
}
