/**
 * Settings: the basemap tile server (with its attribution), the plume lattice resolution, and the
 * case's coordinate frame (map positions in longitude/latitude, or metres from a site datum for
 * sites planned on paper). Changing the frame converts every position exactly through the local
 * tangent plane at the datum (src/geo/projection.ts), so nothing moves on the ground.
 */
import { useEffect, useRef, useState } from 'preact/hooks';
import { settings, updateSettings, checkTileUrl, DEFAULT_TILE_URL, DEFAULT_TILE_ATTRIBUTION, type ScreenSettings } from '../settings';
import { currentCase, updateCase } from '../state';
import { convertFrame } from '../frame';
import { ALLOWED_TILE_ORIGINS } from '../../app/tilePolicy';

export function SettingsDialog({ onClose, at = 'all' }: { onClose: () => void; at?: 'all' | 'site' }) {
  const s = settings.value;
  const [url, setUrl] = useState(s.tileUrl);
  const [attr, setAttr] = useState(s.tileAttribution);
  const urlError = checkTileUrl(url);
  const first = useRef<HTMLInputElement>(null);
  useEffect(() => {
    if (at === 'site') {
      const lon = document.getElementById('dg-datum-lon');
      lon?.scrollIntoView({ block: 'center' });
      lon?.focus();
    } else first.current?.focus();
    const key = (e: KeyboardEvent) => e.key === 'Escape' && onClose();
    addEventListener('keydown', key);
    return () => removeEventListener('keydown', key);
  }, []);
  return (
    <div class="dg-dialog-back" onClick={(e) => e.target === e.currentTarget && onClose()}>
      <div class="dg-dialog" role="dialog" aria-modal="true" aria-labelledby="settings-title">
        <div class="dg-dialog-head">
          <h2 id="settings-title">Settings</h2>
          <button type="button" onClick={onClose}>
            Close
          </button>
        </div>
        <h3>Basemap</h3>
        <label class="dg-field">
          <span>Tile URL ({'{z}'}, {'{x}'}, {'{y}'}; empty for the site grid only)</span>
          <input ref={first} class="dg-text" value={url} spellcheck={false} onInput={(e) => setUrl((e.target as HTMLInputElement).value.trim())} />
        </label>
        {urlError && <p class="dg-field-error" role="alert">{urlError}</p>}
        <label class="dg-field">
          <span>Attribution shown on the map (required by most tile providers)</span>
          <input class="dg-text" value={attr} onInput={(e) => setAttr((e.target as HTMLInputElement).value)} />
        </label>
        <div class="dg-btn-row">
          <button type="button" disabled={!!urlError} onClick={() => updateSettings({ tileUrl: url, tileAttribution: attr })}>
            Use this basemap
          </button>
          <button
            type="button"
            onClick={() => {
              setUrl(DEFAULT_TILE_URL);
              setAttr(DEFAULT_TILE_ATTRIBUTION);
              updateSettings({ tileUrl: DEFAULT_TILE_URL, tileAttribution: DEFAULT_TILE_ATTRIBUTION });
            }}
          >
            OpenStreetMap (default)
          </button>
        </div>
        <p class="dg-help">
          Tiles need a connection; when they cannot load, the map shows a plain site grid with a scale bar and north arrow and work
          continues. Only the app itself and this tile server are ever contacted; this build allows tiles from{' '}
          {ALLOWED_TILE_ORIGINS.join(', ')}.
        </p>
        <h3>Plume detail</h3>
        <label class="dg-field">
          <span>Contour lattice (nodes per side)</span>
          <select
            class="dg-select"
            value={String(s.gridSize)}
            onChange={(e) => updateSettings({ gridSize: Number((e.target as HTMLSelectElement).value) as ScreenSettings['gridSize'] })}
          >
            {[64, 128, 192, 256].map((n) => (
              <option value={n} key={n}>
                {n} × {n}
                {n === 128 ? ' (default)' : ''}
              </option>
            ))}
          </select>
        </label>
        <FrameSettings />
      </div>
    </div>
  );
}

function FrameSettings() {
  const c = currentCase.value;
  const [lon, setLon] = useState(c.site.frame === 'geographic' ? String(c.site.datum[0]) : '');
  const [lat, setLat] = useState(c.site.frame === 'geographic' ? String(c.site.datum[1]) : '');
  const lo = Number(lon), la = Number(lat);
  const ok = lon.trim() !== '' && lat.trim() !== '' && Number.isFinite(lo) && Number.isFinite(la) && Math.abs(lo) <= 180 && Math.abs(la) <= 85;
  return (
    <div class="dg-group">
      <h3>Site coordinates</h3>
      {c.site.frame === 'local' ? (
        <>
          <p class="dg-help">
            This case is in local coordinates: metres east and north of a site datum, for sites planned on paper. To place it on the
            basemap, give the datum's longitude and latitude (WGS 84, degrees).
          </p>
          <div class="dg-pair">
            <label class="dg-field">
              <span>Datum longitude (−180 to 180)</span>
              <input id="dg-datum-lon" class="dg-text" inputMode="decimal" value={lon} onInput={(e) => setLon((e.target as HTMLInputElement).value)} />
            </label>
            <label class="dg-field">
              <span>Datum latitude (−85 to 85)</span>
              <input class="dg-text" inputMode="decimal" value={lat} onInput={(e) => setLat((e.target as HTMLInputElement).value)} />
            </label>
          </div>
          {!ok && (lon || lat) && <p class="dg-field-error">Datum: longitude must be in [−180, 180] and latitude in [−85, 85] degrees.</p>}
          <button type="button" disabled={!ok} onClick={() => updateCase((d) => Object.assign(d, convertFrame(d, 'geographic', [lo, la])))}>
            Put this case on the basemap
          </button>
        </>
      ) : (
        <>
          <p class="dg-help">
            This case is on the basemap (longitude/latitude, datum {c.site.datum[0].toFixed(5)}, {c.site.datum[1].toFixed(5)}). Local
            coordinates show metres east and north of the datum on a plain grid.
          </p>
          <button type="button" onClick={() => updateCase((d) => Object.assign(d, convertFrame(d, 'local', d.site.datum)))}>
            Switch to local metres
          </button>
        </>
      )}
    </div>
  );
}
