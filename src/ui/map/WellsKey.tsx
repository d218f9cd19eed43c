/**
 * Legend of the well-field layers under the map: the capture zones with the choice of
 * time-of-travel marks (water, as for wellhead protection, or the contaminant, slowed by R), the
 * lines of equal water level (what they show, their interval, where they are left out) with a switch
 * to hide them, and the particle plume with its run (particles, seed, partial or out of date) and a
 * switch to hide it.
 */
import { currentCase, currentResults } from '../state';
import { headForm, headLevelsOf, showHeadLines, travelMarks } from './wellLayers';
import { particleCaseKey, particleLayer, particleRun, showParticleLayer } from '../particleState';
import { fmtTime } from '../format';
import { scaleLabel, unitSystem } from '../../case/unitSystem';
import '../wells.css';

export function WellsKey() {
  const w = currentResults.value?.wells ?? null;
  const layer = particleLayer.value;
  const run = particleRun.value;
  const heads = w?.headContours ?? null;
  const hasHeads = !!heads && (heads.levels.length > 0 || heads.unconfined.levels.length > 0);
  const form = headForm.value;
  if (!(w && w.zones.length) && !layer && !hasHeads) return null;
  const system = unitSystem(currentCase.value);
  const current = run.caseKey === particleCaseKey(currentCase.value);
  return (
    <div class="dg-plume-key dg-wells-key" aria-label="Well field legend">
      {w && w.zones.length > 0 && (
        <div class="dg-key-row">
          <Sample kind="capture" />
          <span>Capture zone (steady flow, traced to 100 years of travel);</span>
          <Sample kind="mark" />
          <span>years of travel to the well for</span>
          <span class="dg-seg" role="group" aria-label="Time-of-travel marks for">
            {(['water', 'contaminant'] as const).map((m) => (
              <button type="button" key={m} class={travelMarks.value === m ? 'dg-on' : ''} aria-pressed={travelMarks.value === m} onClick={() => (travelMarks.value = m)}>
                {m === 'water' ? 'water' : 'the contaminant (× R)'}
              </button>
            ))}
          </span>
        </div>
      )}
      {hasHeads && (
        <div class="dg-key-row" data-testid="head-lines-key">
          <label class="dg-check dg-key-check">
            <input type="checkbox" data-testid="show-head-lines" checked={showHeadLines.value} onChange={(e) => (showHeadLines.value = (e.target as HTMLInputElement).checked)} />
            <Sample kind="heads" />
            <span>
              {form === 'confined' ? 'Water level' : 'Water table (Dupuit–Forchheimer)'} relative to the release: a line every{' '}
              {Number((form === 'confined' ? heads.step : heads.unconfined.step).toPrecision(6))} {heads.unit}, none within {scaleLabel(heads.clipRadius, system, 1)} of a pumping
              well{form === 'unconfined' && heads.unconfined.dewatered ? '; none where the aquifer would be dewatered' : ''}
              {headLevelsOf(heads, form).length === 0 ? ' (no line in this form)' : ''}
            </span>
          </label>
          <span class="dg-seg" role="group" aria-label="Water levels as for an aquifer">
            {(['confined', 'unconfined'] as const).map((m) => (
              <button type="button" key={m} class={form === m ? 'dg-on' : ''} aria-pressed={form === m} onClick={() => (headForm.value = m)}>
                {m === 'confined' ? 'confined' : 'unconfined'}
              </button>
            ))}
          </span>
        </div>
      )}
      {layer && (
        <div class="dg-key-row">
          <Sample kind="particles" />
          <span>
            Particles (random walk, {run.status === 'done' ? run.particles : `${layer.particlesDone} of ${run.particles}`} particles, seed {run.seed})
            {' '}≥ limit, 10×, … after {fmtTime(layer.time)}
            {!current ? ' — out of date' : run.status !== 'done' ? ' — partial' : ''}
          </span>
          <label class="dg-check dg-key-check">
            <input type="checkbox" checked={showParticleLayer.value} onChange={(e) => (showParticleLayer.value = (e.target as HTMLInputElement).checked)} />
            <span>show</span>
          </label>
        </div>
      )}
    </div>
  );
}

/** A sample of the line or area as drawn on the map (the map's own classes, so the colours match). */
function Sample({ kind }: { kind: 'capture' | 'mark' | 'particles' | 'heads' }) {
  return (
    <svg class="dg-key-sample" viewBox="0 0 30 14" width="30" height="14" aria-hidden="true">
      {kind === 'capture' ? (
        <rect class="dg-capture-zone" x="1.5" y="1.5" width="27" height="11" rx="2" stroke-width="2" />
      ) : (
        <path class={kind === 'mark' ? 'dg-travel-mark' : kind === 'heads' ? 'dg-head-line' : 'dg-particle-band'} d="M1 7H29" stroke-width="2.5" fill="none" />
      )}
    </svg>
  );
}
