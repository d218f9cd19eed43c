/**
 * The plume's time: a slider over (0, horizon], play, and the steady-state view. Dragging and
 * playing show transient times (not saved); letting go saves the time shown with the case.
 */
import { useEffect, useRef } from 'preact/hooks';
import { currentCase, updateCase } from '../state';
import { playTime } from '../view';
import { toInternal, fromInternal } from '../../core/units';
import { fmtTime } from '../format';

const STEPS = 200;
/** play takes this long from start to horizon, ms */
const PLAY_MS = 8000;

export function TimeBar() {
  const c = currentCase.value;
  const hq = c.evaluation.horizon;
  const horizon = toInternal(hq.value, hq.unit);
  const vt = c.evaluation.viewTime;
  const steady = vt === null;
  const saved = vt === null ? horizon : Math.min(horizon, toInternal(vt.value, vt.unit));
  const shown = playTime.value ?? saved;
  const timer = useRef<number | null>(null);

  const commit = (t: number) => {
    playTime.value = null;
    // keep the horizon's unit for the saved view time
    const v = Number(fromInternal(t, hq.unit).toPrecision(6));
    updateCase((d) => void (d.evaluation.viewTime = { value: v, unit: hq.unit }));
  };
  const stop = () => {
    if (timer.current !== null) cancelAnimationFrame(timer.current);
    timer.current = null;
  };
  useEffect(() => stop, []);
  const playing = timer.current !== null || playTime.value !== null;

  const play = () => {
    if (timer.current !== null) {
      stop();
      commit(playTime.peek() ?? saved);
      return;
    }
    const start = performance.now();
    const from = steady || saved >= horizon * 0.999 ? 0 : saved;
    const tick = () => {
      const f = Math.min(1, (performance.now() - start) / PLAY_MS);
      const t = Math.max(horizon / STEPS, from + (horizon - from) * f);
      playTime.value = t;
      if (f < 1) timer.current = requestAnimationFrame(tick);
      else {
        timer.current = null;
        commit(horizon);
      }
    };
    timer.current = requestAnimationFrame(tick);
  };

  const toStep = (t: number) => Math.round((t / horizon) * STEPS);
  const fromStep = (k: number) => Math.max(1, k) * (horizon / STEPS);
  return (
    <div class="dg-timebar" role="group" aria-label="Time shown on the map">
      <button type="button" class="dg-play" aria-label={timer.current !== null ? 'Pause' : 'Play the plume over time'} onClick={play}>
        {timer.current !== null ? '❚❚' : '▶'}
      </button>
      <input
        type="range"
        min={1}
        max={STEPS}
        step={1}
        value={steady && !playing ? STEPS : toStep(shown)}
        aria-label="Time since the release began"
        aria-valuetext={steady && !playing ? 'steady state' : fmtTime(shown)}
        disabled={steady && !playing}
        onInput={(e) => {
          stop();
          playTime.value = fromStep(Number((e.target as HTMLInputElement).value));
        }}
        onChange={(e) => commit(fromStep(Number((e.target as HTMLInputElement).value)))}
      />
      <output class="dg-time-out" data-testid="time-shown">
        {steady && !playing ? 'steady state' : fmtTime(shown)}
      </output>
      <button
        type="button"
        class={`dg-steady${steady ? ' dg-on' : ''}`}
        aria-pressed={steady}
        onClick={() => {
          stop();
          playTime.value = null;
          if (steady) commit(horizon);
          else updateCase((d) => void (d.evaluation.viewTime = null));
        }}
      >
        Steady state
      </button>
    </div>
  );
}
