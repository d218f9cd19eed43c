/**
 * The screen. Map first; beside it (landscape) or under it (portrait) the panel, in the order a
 * screening is reasoned through on site: the release, the flow, the ground, what is at risk, what each
 * receptor will see. Results follow every input without a run step.
 */
import { useEffect, useState } from 'preact/hooks';
import { computed } from '@preact/signals';
import type { AppSlots } from '../app/boot';
import type { Case } from '../case/schema';
import { currentCase, replaceCase, updateCase } from './state';
import { settings, updateSettings } from './settings';
import { ReleasePanel } from './panels/ReleasePanel';
import { FlowPanel } from './panels/FlowPanel';
import { AquiferPanel } from './panels/AquiferPanel';
import { ReceptorsPanel } from './panels/ReceptorsPanel';
import { CautionStrip, ResultsPanel } from './panels/ResultsPanel';
import { lazyPart } from './lazy';
import { DEMO_CASES } from './demos';
import { HistoryButtons } from './HistoryButtons';
import { openDemoCase } from '../app/actions';
import { openSections, settingsOpen } from './view';
import { startEvaluation } from './evaluation';
import { CaseGuard } from './Guard';
import { placementProblem } from '../case/check';
import { notify } from '../app/session';
// Leaflet's stylesheet (about 4 KB) stays in the first load, before the app's own, so the app's rules
// for the map win over Leaflet's as they always have while the map's JavaScript loads on demand
import 'leaflet/dist/leaflet.css';
import './app.css';

// the pumping wells and particles, loaded after the first screen (src/ui/lazy.tsx)
const WellsPanel = lazyPart(() => import('./panels/WellsPanel').then((m) => m.WellsPanel), 'wells panel');
// opened from the header; loaded when first opened (src/ui/lazy.tsx)
// the map and Leaflet (a third of the first screen's JavaScript): the inputs and the receptor table
// are usable while its chunk arrives on a poor link (precached: offline it opens at once)
const MapView = lazyPart(() => import('./map/MapView').then((m) => m.MapView), 'map', { holder: 'dg-map-wrap' });
// the probabilistic and monitoring panels (with their statistics and CSV import) are not needed for
// the first view: their chunks load as soon as the screen is up (DEVELOPERS.md, "First load")
const UncertaintyPanel = lazyPart(() => import('./panels/UncertaintyPanel').then((m) => m.UncertaintyPanel), 'probabilistic panel');
const MonitoringPanel = lazyPart(() => import('./panels/MonitoringPanel').then((m) => m.MonitoringPanel), 'monitoring panel');
const SettingsDialog = lazyPart(() => import('./panels/SettingsDialog').then((m) => m.SettingsDialog), 'settings', { overlay: true });

export interface AppProps {
  initialCase: Case;
  slots: AppSlots;
}

export function App({ initialCase, slots }: AppProps) {
  const [started] = useState(() => {
    replaceCase(initialCase);
    return true;
  });
  useEffect(() => startEvaluation(), []);
  const CaseMenu = slots.caseMenu;
  const Status = slots.status;
  return (
    <div class="dg-app" data-started={started}>
      <header class="dg-header">
        {/* the app's name is the page's heading; its mark is a release (the map's hexagon) and the
            plume it sends downgradient, drawn so it is not taken for a menu button */}
        <h1 class="dg-brand">
          <svg class="dg-brand-mark" viewBox="0 0 32 32" width="30" height="30" aria-hidden="true">
            <path class="dg-brand-plume" d="M10 16C14 12.5 18.5 7.5 24.5 7.5C29 7.5 31.2 11.5 31.2 16C31.2 20.5 29 24.5 24.5 24.5C18.5 24.5 14 19.5 10 16Z" />
            <path class="dg-brand-core" d="M10 16C14 14.5 17.5 12 21.5 12C24.5 12 26 13.8 26 16C26 18.2 24.5 20 21.5 20C17.5 20 14 17.5 10 16Z" />
            <path class="dg-brand-source" d="M7.5 9.5L13 12.75V19.25L7.5 22.5L2 19.25V12.75Z" />
          </svg>
          <span class="dg-brand-name">Downgradient</span>
        </h1>
        <CaseName />
        <DemoPicker />
        <HistoryButtons />
        {CaseMenu && <CaseMenu />}
        <span class="dg-header-gap" />
        {Status && <Status />}
        <button
          type="button"
          class="dg-icon-btn"
          aria-label={settings.value.theme === 'dark' ? 'Light theme' : 'Dark theme'}
          title={settings.value.theme === 'dark' ? 'Light theme' : 'Dark theme'}
          onClick={() => updateSettings({ theme: settings.value.theme === 'dark' ? 'light' : 'dark' })}
        >
          {settings.value.theme === 'dark' ? '☀' : '☾'}
        </button>
        <button type="button" class="dg-icon-btn" aria-label="Settings" title="Settings" onClick={() => (settingsOpen.value = 'all')}>
          ⚙
        </button>
      </header>
      <main class="dg-main">
        <CaseGuard what="The map">
          <MapView frameKey={mapKey.value} problem={mapProblem.value} />
        </CaseGuard>
        <div class="dg-panel" aria-label="Inputs and results">
          {PANELS.map(([what, Panel]) => (
            <CaseGuard key={what} what={what}>
              <Panel />
            </CaseGuard>
          ))}
        </div>
      </main>
      <CautionStrip />
      {settingsOpen.value && <SettingsDialog at={settingsOpen.value} onClose={() => (settingsOpen.value = null)} />}
    </div>
  );
}

/** The panel, in the order a screening is reasoned through; each drawn inside its own guard. */
const PANELS: [string, preact.ComponentType][] = [
  ['The release inputs', ReleasePanel],
  ['The flow inputs', FlowPanel],
  ['The aquifer inputs', AquiferPanel],
  ['The receptors', ReceptorsPanel],
  ['The results', ResultsPanel],
  ['The pumping wells', () => <WellsPanel />],
  ['How sure it is', UncertaintyPanel],
  ['What was measured', MonitoringPanel],
];

/** Why no map can be framed on the case on screen (in words), or null. */
const mapProblem = computed(() => {
  const p = placementProblem(currentCase.value);
  return p ? p.message : null;
});

/** The map is rebuilt only when another case opens or the case's frame changes. */
const mapKey = computed(() => {
  const c = currentCase.value;
  return `${c.id}|${c.site.frame}|${c.site.datum.join(',')}`;
});

function CaseName() {
  return (
    <input
      class="dg-case-name"
      aria-label="Case name"
      value={currentCase.value.name}
      maxLength={200}
      onChange={(e) => {
        const name = (e.target as HTMLInputElement).value.trim();
        if (name) updateCase((d) => void (d.name = name));
        else (e.target as HTMLInputElement).value = currentCase.peek().name;
      }}
    />
  );
}

function DemoPicker() {
  if (DEMO_CASES.length === 0) return null;
  return (
    <select
      class="dg-demo"
      aria-label="Open a demo case"
      value=""
      onChange={(e) => {
        const el = e.target as HTMLSelectElement;
        const d = DEMO_CASES.find((x) => x.file === el.value);
        el.value = '';
        if (d)
          d.build().then(
            (c) => {
              void openDemoCase(() => c);
              // a demo opens on its results; the inputs are one tap away
              openSections.value = new Set();
            },
            (e: unknown) => notify({ tone: 'warn', text: `The demo case “${d.name}” could not be opened (${e instanceof Error ? e.message : String(e)}).` }),
          );
      }}
    >
      <option value="">Demo cases…</option>
      {DEMO_CASES.map((d) => (
        <option value={d.file} key={d.file}>
          {d.name}
        </option>
      ))}
    </select>
  );
}
