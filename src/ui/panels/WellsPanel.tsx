/**
 * What the pumping wells draw: per pumping well whether the release lies in its capture zone, the
 * share of the source width it draws, and the travel time from the source (contaminant and water,
 * advective), with the single-well closed forms; and the particle view — a random walk in the
 * well field, run in workers with progress, time left and cancel (src/ui/particleRun.ts), whose
 * figures carry their standard error, particle count and seed, and whose plume is drawn on the
 * map. The well-field assumptions are listed with every figure. The analytical results and the map
 * stay live while particles run.
 */
import { useState } from 'preact/hooks';
import { Section } from './Section';
import { RunProgress } from '../RunProgress';
import { currentCase, currentResults } from '../state';
import { fmtConc, fmtLength, fmtRate, fmtTime } from '../format';
import { fmtNum } from '../fields';
import { WELL_FIELD_ASSUMPTIONS } from '../../case/caution';
import { DEFAULT_PARTICLES } from '../../case/particles';
import { particleCaseKey, particleRun } from '../particleState';
import { cancelParticles, startParticles } from '../particleRun';
import { singleWellText } from './WellInputs';
import '../wells.css';
import { scaleLabel, unitSystem } from '../../case/unitSystem';

export function WellsPanel() {
  const c = currentCase.value;
  const r = currentResults.value;
  const w = r?.wells ?? null;
  const pumping = c.site.receptors.filter((x) => x.pumping && x.pumpingRate);
  const run = particleRun.value;
  const current = run.caseKey === particleCaseKey(c);
  const captured = w?.captures.filter((x) => x.capturesSource).length ?? 0;
  const summary = w
    ? `${w.captures.length} pumping well${w.captures.length === 1 ? '' : 's'} modelled; the release lies in ${captured === 0 ? 'no' : captured} capture zone${captured === 1 ? '' : 's'}`
    : pumping.length
      ? 'Pumping wells noted; give the saturated thickness to model them'
      : 'No pumping well with a rate';
  return (
    <Section id="wells" title="What do the pumping wells draw?" summary={summary} class="dg-wells">
      <WellFigures />
      <h3>Particles in the well field</h3>
      <p class="dg-help">
        A random walk of particles released from the source plane, moved by the flow towards the wells and spread by dispersion; the plume it
        gives is drawn on the map. Each figure carries its statistical error (± one standard error); the same seed and count give the same
        figures. The analytical figures above do not represent pumping.
      </p>
      <ParticleControls c={c} />
      {run.status === 'running' && (
        <RunProgress done={run.done} total={run.particles} what="particles" barLabel="Particles walked" workers={run.workers} secondsLeft={run.secondsLeft} testId="particle-progress" count={(n) => n.toLocaleString('en')} />
      )}
      {run.status === 'failed' && run.error && (
        <p class="dg-field-error" role="alert">
          {run.error}
        </p>
      )}
      {run.status === 'cancelled' && (
        <p class="dg-note" data-testid="particle-cancelled">
          Cancelled: the figures below come from the {run.done.toLocaleString('en')} particles walked (an interleaved share of the release, scaled
          to the whole), so their errors are larger.
        </p>
      )}
      {run.receptors && <ParticleResults current={current} />}
      <details class="dg-assumptions-box">
        <summary>What the well field and particle figures assume</summary>
        <ul class="dg-assumptions">
          {WELL_FIELD_ASSUMPTIONS.map((a) => (
            <li key={a.id}>{a.text}</li>
          ))}
        </ul>
      </details>
    </Section>
  );
}

function WellFigures() {
  const c = currentCase.value;
  const w = currentResults.value?.wells ?? null;
  if (!w)
    return (
      <p class="dg-help">
        To model a pumping well: tick <strong>Pumps</strong> on the receptor and give its rate (“What is at risk?”), and give the aquifer's
        saturated thickness (“What is the ground like?”). Rivers, lake shores and barriers are drawn with <strong>+ River / barrier</strong> on
        the map.
      </p>
    );
  return (
    <div class="dg-table-wrap" tabIndex={0} role="region" aria-label="Pumping wells and the release">
      <table class="dg-table dg-wells-table" data-testid="wells-table">
        <caption>
          Steady flow to the pumping wells (saturated thickness {fmtLength(w.thickness)}; method: analytical well field, streamlines traced
          from the source)
        </caption>
        <thead>
          <tr>
            <th scope="col">Pumping well</th>
            <th scope="col">Release in its capture zone?</th>
            <th scope="col">Travel from the release</th>
          </tr>
        </thead>
        <tbody>
          {w.captures.map((x) => {
            const name = c.site.receptors.find((r) => r.id === x.receptorId)?.name ?? x.receptorId;
            return (
              <tr key={x.receptorId} data-well={x.receptorId} data-captures={x.capturesSource}>
                <th scope="row">
                  {name}
                  <span class="dg-alt">{fmtRate(x.rate)}</span>
                </th>
                <td>
                  {x.capturesSource ? <strong>Yes</strong> : 'No'}
                  <span class="dg-alt">draws {fmtNum(100 * x.sourceShare, 3)} % of the source width's water</span>
                  {x.singleWell && <span class="dg-method">{singleWellText(x.singleWell)}</span>}
                </td>
                <td>
                  {x.travelTimeFromSource === null ? (
                    '—'
                  ) : (
                    <>
                      contaminant about <strong>{fmtTime(x.travelTimeFromSource)}</strong>
                      <span class="dg-alt">water {fmtTime(x.waterTravelTime)}</span>
                      <span class="dg-method">advective, along the flow; dispersion brings the first traces earlier</span>
                    </>
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      {w.zoneError && <p class="dg-field-warn">The capture zones could not be traced: {w.zoneError}</p>}
      <WaterLevels />
    </div>
  );
}

/** Water levels at each receptor in the well field: the confined (constant-thickness) form and the unconfined Dupuit form. */
function WaterLevels() {
  const c = currentCase.value;
  const w = currentResults.value?.wells ?? null;
  if (!w || w.heads.length === 0) return null;
  const name = (id: string) => c.site.receptors.find((r) => r.id === id)?.name || id;
  const signed = (m: number) => (m > 0 ? `+${fmtLength(m)}` : fmtLength(m));
  return (
    <>
      <table class="dg-table dg-wells-table" data-testid="water-levels">
        <caption>
          Water levels in the steady well field, referred to the release (saturated thickness there {fmtLength(w.thickness)}); at a pumping well,
          at its face
        </caption>
        <thead>
          <tr>
            <th scope="col">Receptor</th>
            <th scope="col">Head relative to the release (confined form)</th>
            <th scope="col">Saturated thickness if unconfined (Dupuit–Forchheimer)</th>
          </tr>
        </thead>
        <tbody>
          {w.heads.map((h) => (
            <tr key={h.receptorId} data-receptor={h.receptorId}>
              <th scope="row">{name(h.receptorId)}</th>
              <td data-col="confined">{signed(h.confined)}</td>
              <td data-col="unconfined">{h.dewatered ? <strong>dewatered</strong> : fmtLength(h.unconfined)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <p class="dg-method">
        The capture zones and particles take the saturated thickness as constant (confined form: head = Φ/(K·B)); in an unconfined aquifer the
        water table falls towards a pumping well and the thickness follows h = √(B² + 2ΔΦ/K) (Dupuit–Forchheimer), shown beside it.
      </p>
      {w.headContours && w.headContours.levels.length > 0 && (
        <p class="dg-method" data-testid="head-lines-note">
          On the map, the lines of equal water level are the confined-form head relative to the release, a line every{' '}
          {Number(w.headContours.step.toPrecision(6))} {w.headContours.unit}: equipotentials, which the flow crosses at right angles. In the Dupuit–Forchheimer
          form the lines lie in the same places, only their values differ. Towards a pumping well the level falls ever more steeply (the model's well is a
          line sink), so within {scaleLabel(w.headContours.clipRadius, unitSystem(c), 1)} of one no line is drawn; its level at its face is in the table.
        </p>
      )}
      {w.headWarnings.map((t) => (
        <p class="dg-field-warn" key={t}>
          {t}
        </p>
      ))}
    </>
  );
}

function ParticleControls({ c }: { c: import('../../case/schema').Case }) {
  const run = particleRun.value;
  const [particles, setParticles] = useState(run.particles || DEFAULT_PARTICLES);
  const [seed, setSeed] = useState(run.seed || c.uncertainty?.seed || 1);
  const bad = !Number.isInteger(particles) || particles < 100 || particles > 1_000_000;
  return (
    <div class="dg-btn-row dg-mc-controls">
      <label>
        Particles{' '}
        <input type="number" inputMode="numeric" min={100} max={1_000_000} step={1000} value={particles} onChange={(e) => setParticles(Number((e.target as HTMLInputElement).value))} />
      </label>
      <label>
        Seed{' '}
        <input type="number" inputMode="numeric" min={0} step={1} value={seed} onChange={(e) => setSeed(Number((e.target as HTMLInputElement).value))} />
      </label>
      {run.status === 'running' ? (
        <button type="button" data-action="cancel-particles" onClick={cancelParticles}>
          Cancel
        </button>
      ) : (
        <button type="button" class="dg-on" data-action="run-particles" disabled={bad} onClick={() => startParticles(currentCase.peek(), particles, seed)}>
          {run.receptors ? 'Run particles again' : 'Run particles'}
        </button>
      )}
      {bad && (
        <p class="dg-field-error" role="alert">
          Particles: a whole number from 100 to 1 000 000.
        </p>
      )}
    </div>
  );
}

function ParticleResults({ current }: { current: boolean }) {
  const run = particleRun.value;
  const rs = run.receptors!;
  const partial = run.status !== 'done';
  return (
    <div class={current ? 'dg-mc-results' : 'dg-mc-results dg-stale'} data-testid="particle-results">
      {!current && (
        <p class="dg-stale-note" role="status">
          Out of date: the case changed since this run. Run again for figures that match the inputs.
        </p>
      )}
      <p class="dg-note" data-testid="particle-method">
        Method: particles (random walk, {partial ? `${run.done.toLocaleString('en')} of ` : ''}
        {run.particles.toLocaleString('en')} particles, seed {run.seed}{partial ? ', partial' : ''}); depth-averaged over the saturated thickness; ± one
        standard error.
      </p>
      <div class="dg-table-wrap" tabIndex={0} role="region" aria-label="Particle figures per receptor">
        <table class="dg-table">
          <thead>
            <tr>
              <th scope="col">Receptor</th>
              <th scope="col">At horizon</th>
              <th scope="col">Reaches limit</th>
            </tr>
          </thead>
          <tbody>
            {rs.map((x) => (
              <tr key={x.id} data-receptor={x.id}>
                <th scope="row">{x.name}</th>
                <td data-col="particles-horizon">
                  {fmtConc(x.concentrationAtHorizon)} <span class="dg-pm">± {fmtConc(x.standardError)}</span>
                </td>
                <td data-col="particles-arrival">{x.arrival === null ? 'not within horizon' : `about ${fmtTime(x.arrival)}`}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <ul class="dg-estimators">
        {rs.map((x) => (
          <li key={x.id}>
            {x.name}: {x.estimator}
          </li>
        ))}
      </ul>
      {run.mass && run.mass.released > 0 && (
        <p class="dg-note" data-testid="particle-mass">
          Of the mass released by the horizon: {pct(run.mass.captured, run.mass.released)} pumped out by wells, {pct(run.mass.outflow, run.mass.released)}{' '}
          into rivers or shores, {pct(run.mass.decayed, run.mass.released)} degraded, {pct(run.mass.inAquifer, run.mass.released)} still in the
          aquifer.
        </p>
      )}
      {run.warnings.map((t) => (
        <p class="dg-field-warn" key={t}>
          {t}
        </p>
      ))}
    </div>
  );
}

const pct = (a: number, b: number) => `${fmtNum((100 * a) / b, 3)} %`;
