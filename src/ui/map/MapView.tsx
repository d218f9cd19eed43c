/** The map panel: the Leaflet site map, its tool bar and the plume time control. */
import { useEffect, useRef } from 'preact/hooks';
import 'leaflet/dist/leaflet.css';
import { SiteMap } from './siteMap';
import { currentCase } from '../state';
import { mapTool, tileState, type MapTool } from '../view';
import { TimeBar } from './TimeBar';
import { currentPlume } from '../evaluation';
import { fmtTime } from '../format';

let active: SiteMap | null = null;
/** The live map controller (tests and the latency measurement hook into it). */
export function activeSiteMap(): SiteMap | null {
  return active;
}

export function MapView({ frameKey }: { frameKey: string }) {
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const m = new SiteMap(ref.current!, currentCase.peek());
    active = m;
    const ro = new ResizeObserver(() => m.map.invalidateSize({ pan: false }));
    ro.observe(ref.current!);
    return () => {
      ro.disconnect();
      m.destroy();
      if (active === m) active = null;
    };
  }, [frameKey]);
  return (
    <div class="dg-map-wrap">
      <MapTools />
      <div class="dg-map-box">
        <div ref={ref} class="dg-map" role="application" aria-label="Site map" />
      </div>
      <div class="dg-map-foot">
        {tileState.value === 'failed' && (
          <p class="dg-map-note" role="status" data-testid="tiles-failed">
            No basemap (offline or no signal): site grid shown; everything else works.
          </p>
        )}
        <PlumeKey />
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

function MapTools() {
  const tool = mapTool.value;
  const hint = TOOLS.find((t) => t.id === tool)?.hint ?? '';
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
      {tool !== 'move' && <span class="dg-tool-hint" role="status">{hint}</span>}
    </div>
  );
}

/** Legend of the plume bands, with the screening label the plume always carries. */
function PlumeKey() {
  const p = currentPlume.value;
  if (!p) return null;
  return (
    <div class="dg-plume-key" aria-label="Plume legend">
      <strong>
        Plume {p.time === Infinity ? 'at steady state' : `after ${fmtTime(p.time)}`}, {p.depth} m below water table — screening estimate (
        {p.solution === 'domenico' ? 'Domenico' : 'exact solution'}):
      </strong>
      <ul>
        {p.thresholds.map((t, k) => (
          <li key={t}>
            <span class={`dg-swatch dg-band-${Math.min(k, 3)}`} aria-hidden="true" />
            {k === 0 ? '≥ limit' : `≥ ${Math.round(t / p.thresholds[0])}×`}
          </li>
        ))}
      </ul>
    </div>
  );
}
