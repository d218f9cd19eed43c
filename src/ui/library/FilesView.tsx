/**
 * Files out (case file, GeoJSON, CSV tables, share, printable report) and in (case file import
 * with validation: a rejected file changes nothing stored, and the message says what is wrong).
 */
import { resultUnit } from '../../case/unitSystem';
import { useState } from 'preact/hooks';
import { currentCase, currentResults } from '../state';
import { importCaseText, importForRepair, resolveImport, type ImportOutcome } from '../../app/actions';
import type { Case } from '../../case/schema';
import { canShareFiles, downloadFile, shareFiles, type OutFile } from './download';
import {
  captureZonesCsvFile,
  caseFile,
  curvesCsvFile,
  geojsonFile,
  observationsCsvFile,
  particleCsvFile,
  particleCurvesCsvFile,
  receptorCsvFile,
  uncertaintyCsvFile,
  type Built,
} from './outputs';
import { particleRunFor } from '../particleState';
import { reportOpen } from './reportOpen';
import { DEFAULT_MAX_BYTES } from '../../case/io';
import { decodeText } from '../../case/text';
import { SCREENING_CAUTION } from '../../case/caution';
import { sheet } from './CaseMenu';
import { settingsOpen } from '../view';
import { geojsonNeedsPlacement } from '../../case/export-geojson';

/** Control characters from a hostile file would render as garbage: show them as a visible mark. */
function printable(s: string): string {
  return s.replace(/[\u0000-\u0008\u000b-\u001f\u007f-\u009f]/g, '␀');
}

type Msg = { tone: 'ok' | 'error'; lines: string[]; repairable?: Case; placeOnMap?: boolean } | null;

export function FilesView() {
  const [msg, setMsg] = useState<Msg>(null);
  const [busy, setBusy] = useState(false);
  const [pending, setPending] = useState<(Extract<ImportOutcome, { ok: 'choose' }> & { fileName: string }) | null>(null);
  const c = currentCase.value;
  const r = currentResults.value;
  const share = canShareFiles();
  const unplaced = geojsonNeedsPlacement(c) !== null;

  const out = (build: () => Built) => {
    const b = build();
    if (!b.ok) return setMsg({ tone: 'error', lines: [b.error], placeOnMap: b.placeOnMap });
    downloadFile(b.file);
    setMsg({ tone: 'ok', lines: [`Saved ${b.file.name} to your downloads.`] });
  };

  const shareAll = async () => {
    const files: OutFile[] = [];
    const errors: string[] = [];
    for (const b of [caseFile(c), geojsonFile(c, r), receptorCsvFile(c, r)]) {
      if (b.ok) files.push(b.file);
      else errors.push(b.error);
    }
    const ok = await shareFiles(files, c.name, `${c.name} — screening files. ${SCREENING_CAUTION}`);
    setMsg(ok ? { tone: 'ok', lines: [`Shared ${files.map((f) => f.name).join(', ')}.`, ...errors] } : { tone: 'error', lines: ['Sharing was cancelled or is not possible for these files.', ...errors] });
  };

  const onImport = async (input: HTMLInputElement) => {
    const file = input.files?.[0];
    input.value = '';
    if (!file) return;
    setBusy(true);
    try {
      if (file.size > DEFAULT_MAX_BYTES) {
        setMsg({ tone: 'error', lines: [`${file.name}: the file is ${(file.size / 1048576).toFixed(1)} MB, larger than the ${DEFAULT_MAX_BYTES / 1048576} MB accepted for a case file. Nothing was imported.`] });
        return;
      }
      // the one reading rule for text (src/case/text.ts), the command line's too
      const decoded = decodeText(new Uint8Array(await file.arrayBuffer()));
      if (!decoded.ok) {
        setMsg({ tone: 'error', lines: [`${file.name}: ${decoded.error}; a case file is JSON text.`, 'Nothing was imported; the cases on this device are unchanged.'] });
        return;
      }
      const res = await importCaseText(decoded.text, file.name);
      setPending(res.ok === 'choose' ? { ...res, fileName: file.name } : null);
      if (res.ok === 'choose') setMsg(null);
      else if (res.ok) setMsg({ tone: 'ok', lines: [`Imported “${res.name}” from ${file.name} and opened it.`, ...(res.note ? [res.note] : [])] });
      else setMsg({ tone: 'error', lines: [...res.errors, 'Nothing was imported; the cases on this device are unchanged.'], repairable: res.repairable });
    } catch (e) {
      setMsg({ tone: 'error', lines: [`${file.name}: could not be read (${e instanceof Error ? e.message : String(e)}). Nothing was imported.`] });
    } finally {
      setBusy(false);
    }
  };

  const keepForRepair = async (c: Case) => {
    setBusy(true);
    try {
      const res = await importForRepair(c);
      setPending(res.ok === 'choose' ? { ...res, fileName: 'the file' } : null);
      if (res.ok === 'choose') setMsg(null);
      else if (res.ok) setMsg({ tone: 'ok', lines: [`Kept “${res.name}” and opened it.`, ...(res.note ? [res.note] : [])] });
      else setMsg({ tone: 'error', lines: res.errors });
    } finally {
      setBusy(false);
    }
  };

  const choose = async (choice: 'replace' | 'keep-both') => {
    if (!pending) return;
    const p = pending;
    setPending(null);
    const r = await resolveImport(choice, p);
    if (r.ok) setMsg({ tone: 'ok', lines: [choice === 'replace' ? `Replaced “${p.existing.name}” with ${p.fileName} and opened it.` : `Imported ${p.fileName} as “${r.name}” beside “${p.existing.name}” and opened it.`] });
    else setMsg({ tone: 'error', lines: [r.error, 'Nothing was imported; the cases on this device are unchanged.'] });
  };

  return (
    <section aria-label="Files">
      <h2 class="dg-lib-h">Save the open case as a file</h2>
      <p class="dg-lib-note">“{c.name}”</p>
      <div class="dg-lib-grid">
        <button type="button" class="dg-lib-btn" data-testid="export-case" onClick={() => out(() => caseFile(c))}>
          Case file (.json)
          <small>re-opens in Downgradient on any device</small>
        </button>
        {/* a case in local metres has no map coordinates: the refusal offers the way to give it some (placeOnMap) */}
        <button type="button" class="dg-lib-btn" data-testid="export-geojson" onClick={() => out(() => geojsonFile(c, r))}>
          Map layers (GeoJSON)
          <small>
            source, receptors, monitoring wells, flow arrow, plume contours{r?.wells?.zones.length ? ', capture zones and travel-time marks' : ''}{r?.wells?.headContours?.levels.length ? ', water-level lines' : ''} for a GIS
            {unplaced ? '; first place the case on the basemap' : ''}
          </small>
        </button>
        <button type="button" class="dg-lib-btn" data-testid="export-table" onClick={() => out(() => receptorCsvFile(c, r))}>
          Receptor table (CSV)
          <small>arrival, peak and steady values per receptor</small>
        </button>
        <button type="button" class="dg-lib-btn" data-testid="export-curves" onClick={() => out(() => curvesCsvFile(c, r))}>
          Breakthrough curves (CSV)
          <small>concentration over time at each receptor</small>
        </button>
        {(c.uncertainty.headFit || Object.keys(c.uncertainty.inputs).length > 0) && (
          <button type="button" class="dg-lib-btn" data-testid="export-probabilities" onClick={() => out(() => uncertaintyCsvFile(c))}>
            Probabilistic results (CSV)
            <small>distributions, seed and runs, P(reaches limit) ± SE, percentiles and drivers per receptor</small>
          </button>
        )}
        {!!r?.wells?.zones.length && (
          <button type="button" class="dg-lib-btn" data-testid="export-capture-zones" onClick={() => out(() => captureZonesCsvFile(c, r))}>
            Capture zones (CSV)
            <small>each pumping well's zone and 1–25 year travel-time marks, as {unplaced ? `the site grid's east/north ${resultUnit(c, 'length') === 'ft' ? 'feet' : 'metres'}` : 'longitude and latitude'}</small>
          </button>
        )}
        {particleRunFor(c, true) && (
          <>
            <button type="button" class="dg-lib-btn" data-testid="export-particles" onClick={() => out(() => particleCsvFile(c, r))}>
              Particle figures (CSV)
              <small>per receptor: concentration ± standard error, arrival, particle count and seed</small>
            </button>
            <button type="button" class="dg-lib-btn" data-testid="export-particle-curves" onClick={() => out(() => particleCurvesCsvFile(c, r))}>
              Particle curves (CSV)
              <small>concentration and standard error over time at each receptor</small>
            </button>
          </>
        )}
        {c.monitoring.results.length > 0 && (
          <button type="button" class="dg-lib-btn" data-testid="export-observations" onClick={() => out(() => observationsCsvFile(c))}>
            Monitoring results (CSV)
            <small>every sampling result, "&lt;" kept for results below the limit</small>
          </button>
        )}
        <button
          type="button"
          class="dg-lib-btn"
          data-testid="open-report"
          onClick={() => {
            sheet.value = null;
            reportOpen.value = true;
          }}
        >
          Printable report
          <small>preview, then print or save as PDF</small>
        </button>
        {share && (
          <button type="button" class="dg-lib-btn" onClick={() => void shareAll()}>
            Share…
            <small>case file, GeoJSON and table to another app</small>
          </button>
        )}
      </div>

      <h2 class="dg-lib-h">Open a case file</h2>
      <label class="dg-lib-btn is-primary dg-lib-file">
        {busy ? 'Reading…' : 'Choose a case file…'}
        <input
          type="file"
          accept=".json,application/json"
          data-testid="import-input"
          disabled={busy}
          onChange={(e) => void onImport(e.target as HTMLInputElement)}
        />
      </label>
      <p class="dg-lib-note">The file is checked before anything is stored: size (up to 2 MB), JSON, format, version, every field, and the same checks as screening (positions on the map, physical sense).</p>
      {pending && (
        <div ref={(el) => el?.scrollIntoView({ block: 'start' })} class="dg-lib-msg is-ask" role="group" aria-labelledby="dg-import-ask" data-testid="import-choice">
          <p id="dg-import-ask">
            {pending.existing.id === pending.incoming.id ? 'This case is already on the device' : 'A case with this name is already on the device'} (“{pending.existing.name}”,
            saved {new Date(pending.existing.savedAt).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' })}), with other values than {pending.fileName}.
            Nothing is stored until you choose:
          </p>
          <div class="dg-lib-grid">
            <button type="button" class="dg-lib-btn" onClick={() => void choose('replace')}>
              Replace the stored case
              <small>with the file's values; the stored version is overwritten</small>
            </button>
            <button type="button" class="dg-lib-btn is-primary" onClick={() => void choose('keep-both')}>
              Keep both
              <small>the file is stored as “{pending.keepBothName}”</small>
            </button>
            <button
              type="button"
              class="dg-lib-btn"
              onClick={() => {
                setPending(null);
                setMsg({ tone: 'ok', lines: [`${pending.fileName} was not imported; the cases on this device are unchanged.`] });
              }}
            >
              Cancel
              <small>import nothing</small>
            </button>
          </div>
        </div>
      )}
      {msg && (
        <div class={`dg-lib-msg ${msg.tone === 'error' ? 'is-error' : 'is-ok'}`} role={msg.tone === 'error' ? 'alert' : 'status'} data-testid="files-message">
          {msg.lines.map((l, i) => (
            <p key={i}>{printable(l)}</p>
          ))}
          {msg.placeOnMap && (
            <button
              type="button"
              class="dg-lib-btn is-primary"
              data-testid="place-on-map"
              onClick={() => {
                sheet.value = null;
                settingsOpen.value = 'site';
              }}
            >
              Place this case on the basemap…
              <small>give the site datum's longitude and latitude in Settings</small>
            </button>
          )}
          {msg.repairable && (
            <button type="button" class="dg-lib-btn" data-testid="keep-for-repair" disabled={busy} onClick={() => void keepForRepair(msg.repairable!)}>
              Keep it on this device to repair
            </button>
          )}
        </div>
      )}
    </section>
  );
}
