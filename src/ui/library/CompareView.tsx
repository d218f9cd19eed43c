/**
 * Two stored cases side by side: the inputs that differ, and each receptor's result in both.
 * Both cases are screened in a worker of their own (the screen never blocks), which is released
 * when the comparison is done.
 */
import { useEffect, useState } from 'preact/hooks';
import { wrap } from 'comlink';
import type { Case } from '../../case/schema';
import type { CaseSummary } from '../../store/cases';
import type { ScreeningApi } from '../../worker/screening';
import type { Evaluation } from '../results';
import { libraryVersion, session } from '../../app/session';
import { currentCase } from '../state';
import { fmtConc, fmtTime } from '../format';
import { comparePairOrder, inputDifferences, receptorChanges, type Difference, type ReceptorChange, type ReceptorOutcome } from './compare';
import { comparePair } from './CaseMenu';
import { SCREENING_CAUTION } from '../../case/caution';
import { ScrollX } from '../ScrollX';

interface Outcome {
  a: Case;
  b: Case;
  diffs: Difference[];
  changes: ReceptorChange[] | null;
  error: string | null;
}

async function screenBoth(a: Case, b: Case): Promise<[Evaluation, Evaluation]> {
  const worker = new Worker(new URL('../../worker/screening.ts', import.meta.url), { type: 'module', name: 'downgradient-compare' });
  try {
    const api = wrap<ScreeningApi>(worker);
    return [await api.evaluate(a), await api.evaluate(b)];
  } finally {
    worker.terminate();
  }
}

const outcome = (r: Evaluation['receptors'][number]): ReceptorOutcome => ({
  id: r.id,
  name: r.name,
  status: r.status,
  arrival: r.arrival,
  peak: r.peak,
  atHorizon: r.atHorizon,
});

function summary(o: ReceptorOutcome | null): string {
  if (!o) return '—';
  const arrival = o.arrival === null ? 'does not reach the limit' : `limit after ${fmtTime(o.arrival)}`;
  return `${arrival}; peak ${fmtConc(o.peak.c)}`;
}

export function CompareView() {
  const [list, setList] = useState<CaseSummary[]>([]);
  const [ids, setIds] = useState<[string | null, string | null]>(comparePair.value);
  const [result, setResult] = useState<Outcome | null>(null);
  const [busy, setBusy] = useState(false);
  const version = libraryVersion.value;

  useEffect(() => {
    void session.store?.list().then((l) => {
      setList(l);
      setIds((chosen) => comparePairOrder(l, chosen, currentCase.peek().id));
    });
  }, [version]);

  useEffect(() => {
    const [a, b] = ids;
    const store = session.store;
    if (!a || !b || !store) return setResult(null);
    let live = true;
    setBusy(true);
    void (async () => {
      await session.autosaver?.flush();
      const [la, lb] = await Promise.all([store.load(a), store.load(b)]);
      if (!la?.read.ok || !lb?.read.ok) {
        if (live) setResult(null);
        return;
      }
      const ca = la.read.case;
      const cb = lb.read.case;
      const diffs = inputDifferences(ca, cb);
      if (live) setResult({ a: ca, b: cb, diffs, changes: null, error: null });
      try {
        const [ea, eb] = await screenBoth(ca, cb);
        if (live) setResult({ a: ca, b: cb, diffs, changes: receptorChanges(ea.receptors.map(outcome), eb.receptors.map(outcome)), error: null });
      } catch (e) {
        if (live) setResult({ a: ca, b: cb, diffs, changes: null, error: `Results could not be computed: ${e instanceof Error ? e.message : String(e)}` });
      }
    })().finally(() => live && setBusy(false));
    return () => {
      live = false;
    };
  }, [ids[0], ids[1], version]);

  if (list.length < 2) return <p class="dg-lib-empty">Comparing needs two stored cases. Make a what-if copy of a case first.</p>;

  const picker = (k: 0 | 1, label: string) => (
    <label class="dg-lib-pick">
      <span>{label}</span>
      <select
        value={ids[k] ?? ''}
        onChange={(e) => {
          const v = (e.target as HTMLSelectElement).value;
          setIds((p) => (k === 0 ? [v, p[1]] : [p[0], v]));
        }}
      >
        {list.map((x) => (
          <option key={x.id} value={x.id}>
            {x.name}
          </option>
        ))}
      </select>
    </label>
  );

  return (
    <section aria-label="Compare two cases" data-testid="compare-view">
      <div class="dg-lib-row">
        {picker(0, 'First case')}
        {picker(1, 'Second case')}
      </div>
      {result && (
        <>
          <h2 class="dg-lib-h">Inputs that differ</h2>
          {result.diffs.length === 0 ? (
            <p class="dg-lib-empty">The two cases have the same inputs.</p>
          ) : (
            <ScrollX label="Inputs that differ">
              <table class="dg-lib-table">
                <thead>
                  <tr>
                    <th scope="col">Input</th>
                    <th scope="col">{result.a.name}</th>
                    <th scope="col">{result.b.name}</th>
                  </tr>
                </thead>
                <tbody>
                  {result.diffs.map((d) => (
                    <tr key={d.path}>
                      <th scope="row">{d.label}</th>
                      <td>{d.a}</td>
                      <td>{d.b}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </ScrollX>
          )}
          <h2 class="dg-lib-h">What it does at each receptor</h2>
          {busy && !result.changes && <p class="dg-lib-note">Screening both cases…</p>}
          {result.error && (
            <p class="dg-lib-msg is-error" role="alert">
              {result.error}
            </p>
          )}
          {result.changes && result.changes.length === 0 && <p class="dg-lib-empty">Neither case has receptors.</p>}
          {result.changes && result.changes.length > 0 && (
            <ScrollX label="What it does at each receptor">
              <table class="dg-lib-table" data-testid="compare-receptors">
                <thead>
                  <tr>
                    <th scope="col">Receptor</th>
                    <th scope="col">{result.a.name}</th>
                    <th scope="col">{result.b.name}</th>
                    <th scope="col">Change</th>
                  </tr>
                </thead>
                <tbody>
                  {result.changes.map((ch, i) => (
                    <tr key={i}>
                      <th scope="row">{ch.name}</th>
                      <td>{summary(ch.a)}</td>
                      <td>{summary(ch.b)}</td>
                      <td>{ch.effect}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </ScrollX>
          )}
          <p class="dg-lib-caution">{SCREENING_CAUTION}</p>
        </>
      )}
    </section>
  );
}
