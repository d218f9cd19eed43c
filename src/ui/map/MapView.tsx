/** The map panel: the Leaflet site map, its tool bar and the plume time control. */
import { useEffect, useRef } from 'preact/hooks';
import { computed } from '@preact/signals';
import { SiteMap, mapFailure } from './siteMap';
import { inputIssue } from '../validity';
import { currentCase } from '../state';
import { mapTool, tileState, type MapTool } from '../view';
import { TimeBar } from './TimeBar';
import { ExceedanceKey } from './ExceedanceKey';
import { currentPlume } from '../evaluation';
import { fmtLength, fmtTime } from '../format';
import { swatchBackground } from './bandStyle';
import { WellsKey } from './WellsKey';

import { setActiveSiteMap } from './active';

/**
 * `problem`: why no map can be framed on this case (a datum or position that cannot be placed),
 * in words; the map is then replaced by that message and the rest of the screen keeps working.
 */
export function MapView({ frameKey, problem }: { frameKey: string; problem: string | null }) {
  if (problem) return <UnplacedMap problem={problem} />;
  return <LiveMap frameKey={frameKey} />;
}

function UnplacedMap({ problem }: { problem: string }) {
  return (
    <div class="dg-map-wrap">
      <div class="dg-map-box dg-map-none" role="alert" data-testid="map-problem">
        <p>
          <strong>The map cannot be drawn for this case.</strong> {problem}
        </p>
        <p>Correct the position in the panel, or open another case from Cases or Demo cases. Nothing stored has changed.</p>
      </div>
    </div>
  );
}

/**
 * The plume on the map is out of date (an input is invalid and the last contours are kept). A
 * computed flag, so the map's frame re-renders when it flips, not with every new plume: the
 * contours reach the map by its own effect, and nothing else should stand between a result and
 * its paint.
 */
const plumeStale = computed(() => !!inputIssue.value && !!currentPlume.value);

function LiveMap({ frameKey }: { frameKey: string }) {
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const m = new SiteMap(ref.current!, currentCase.peek());
    setActiveSiteMap(m);
    const ro = new ResizeObserver(() => m.map.invalidateSize({ pan: false }));
    ro.observe(ref.current!);
    return () => {
      ro.disconnect();
      m.destroy();
      setActiveSiteMap(null, m);
    };
  }, [frameKey]);
  const stale = plumeStale.value;
  return (
    <div class="dg-map-wrap">
      <MapTools />
      <div class={`dg-map-box${stale ? ' is-stale' : ''}`} data-stale={stale}>
        <div ref={ref} class="dg-map" role="application" aria-label="Site map" />
        {stale && (
          <p class="dg-map-stale" role="status" data-testid="plume-stale">
            Plume out of date: results are paused until the input named in the panel is corrected.
          </p>
        )}
        {mapFailure.value && (
          <p class="dg-map-stale" role="alert" data-testid="map-failure">
            Part of the map cannot be drawn: {mapFailure.value}
          </p>
        )}
        <ToolHint />
      </div>
      <div class="dg-map-foot">
        {tileState.value === 'failed' && (
          <p class="dg-map-note" role="status" data-testid="tiles-failed">
            No basemap (offline or no signal): site grid shown; everything else works.
          </p>
        )}
        <PlumeKey />
        <ExceedanceKey />
        <WellsKey />
        <TimeBar />
      </div>
    </div>
  );
}

const TOOLS: { id: MapTool; label: string; hint: string }[] = [
  { id: 'move', label: 'Pan', hint: 'Pan and zoom; drag any mark to move it' },
  { id: 'place-source', label: 'Release here', hint: 'Tap the map to put the release point there' },
  { id: 'trace-footprint', label: 'Outline', hint: 'Trace the release outline with a finger; lift to close it' },
  { id: 'add-receptor', label: '+ Receptor', hint: 'Tap the map to add a well or other point of concern' },
  { id: 'add-head', label: '+ Water level', hint: 'Tap each monitoring well (three or more) and enter its water level' },
];

/** Tools started from a panel rather than the tool bar (the bar keeps one row on a tablet), with their hints. */
const PANEL_TOOL_HINTS: Partial<Record<MapTool, string>> = {
  'add-monitoring': 'Tap the map where the monitoring well is; then enter its results in “What was measured?”',
  'add-boundary': 'Tap two points along a river bank, lake shore or barrier (the line runs on beyond them); set its kind under “Which way does the water go?”',
};

/** What the active tool does, over the top of the map (so the map keeps its size: a tap lands where the finger is). */
function ToolHint() {
  const tool = mapTool.value;
  const hint = TOOLS.find((t) => t.id === tool)?.hint ?? PANEL_TOOL_HINTS[tool] ?? '';
  return tool !== 'move' ? (
    <p class="dg-tool-hint" role="status" data-testid="tool-hint">
      {hint}
    </p>
  ) : null;
}

function MapTools() {
  const tool = mapTool.value;
  return (
    <div class="dg-map-tools" role="toolbar" aria-label="Map tools">
      {TOOLS.map((t) => (
        <button
          type="button"
          key={t.id}
          class={`dg-tool${tool === t.id ? ' dg-on' : ''}`}
          aria-pressed={tool === t.id}
          data-tool={t.id}
          onClick={() => (mapTool.value = tool === t.id && t.id !== 'move' ? 'move' : t.id)}
        >
          {t.label}
        </button>
      ))}
    </div>
  );
}

/**
 * Legend of the plume bands, with the screening label the plume always carries. Each swatch is
 * painted as its band looks on the map (bandStyle.ts). With the limit at or above the source
 * concentration there are no bands, and the legend says why instead of standing empty.
 */
function PlumeKey() {
  const p = currentPlume.value;
  if (!p) return null;
  const n = p.thresholds.length;
  return (
    <div class="dg-plume-key" role="group" aria-label="Plume legend" data-testid="plume-key">
      <strong>
        Plume {p.time === Infinity ? 'at steady state' : `after ${fmtTime(p.time)}`}, {fmtLength(p.depth)} below water table — screening estimate (
        {p.solution === 'domenico' ? 'Domenico' : 'exact solution'}):
      </strong>
      {n === 0 ? (
        <span class="dg-key-none" data-testid="plume-key-none">
          no band: the limit is at or above the source concentration C₀, so the plume is everywhere below the limit.
        </span>
      ) : (
        <ul>
          {p.thresholds.map((t, k) => (
            <li key={t}>
              <span class="dg-swatch" data-band={Math.min(k, 3)} style={{ background: swatchBackground(k, n) }} aria-hidden="true" />
              {k === 0 ? '≥ limit' : `≥ ${Math.round(t / p.thresholds[0])}×`}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
