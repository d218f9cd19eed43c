/**
 * The screening caution and the list of assumptions behind every result. One text for the
 * command line, the app and the printed report, so the three never drift apart. Shown wherever
 * results appear.
 */

export const SCREENING_CAUTION =
  'Screening-level estimates only. These figures assume a homogeneous aquifer, uniform steady ' +
  'groundwater flow and contaminant in the dissolved phase only; the analytical figures represent ' +
  'no pumping, so a pumping well may draw the plume towards it faster than they show (where a ' +
  'case gives pumping rates and the saturated thickness, capture zones and particle figures ' +
  'model the wells, under the further assumptions listed with them). They are not a site ' +
  'investigation and must not be the sole basis for a decision about a drinking-water supply. ' +
  'Local regulators and licensed hydrogeologists decide, and the limits that apply at your ' +
  'site under local law govern over any example limit shown here.';

export interface Assumption {
  /** stable identifier, for reports and tests */
  readonly id: string;
  /** one line in plain words */
  readonly text: string;
}

export const ASSUMPTIONS: readonly Assumption[] = Object.freeze([
  {
    id: 'aquifer',
    text: 'The aquifer is homogeneous and isotropic in its transport properties and of unlimited extent; layering, fractures and preferential paths are not represented.',
  },
  {
    id: 'flow',
    text: 'Groundwater flow is uniform and steady: one seepage velocity v = K·i/nₑ in one direction for the whole time span; seasonal swings and flow towards pumping wells or streams are not represented.',
  },
  {
    id: 'dissolved',
    text: 'Only the dissolved phase is transported; free product (LNAPL/DNAPL), vapour and colloid transport are outside the model, and the source concentration stands in for them.',
  },
  {
    id: 'source',
    text: 'The source is a vertical rectangular plane across the flow at x = 0, its top at the water table, held at the source concentration (constant, declining first-order with the source half-life, or stopping after the release duration as the case says).',
  },
  {
    id: 'sorption',
    text: 'Sorption is linear, reversible and at equilibrium: R = 1 + ρb·Kd/n with Kd = Koc·foc unless Kd is given; retardation divides the seepage velocity and the dispersion coefficients.',
  },
  {
    id: 'decay',
    text: 'Biodegradation is first-order with one half-life (λ = ln 2 / t½); it acts on dissolved and sorbed mass alike unless the case says dissolved phase only, in which case the effective rate is λ/R. Daughter products are not generated.',
  },
  {
    id: 'dispersion',
    text: 'Dispersion is Fickian: Dᵢ = αᵢ·v (+ De). Dispersivity estimated from the travel distance is a scale relation with scatter of orders of magnitude in field data (Gelhar, Welty & Rehfeldt 1992); site values are better.',
  },
  {
    id: 'diffusion',
    text: 'Molecular diffusion, when included, is De = D0·τ; it is added exactly to the dispersion coefficients in Ogata–Banks and in the exact rectangular-source solution, and enters the Domenico approximation as an effective dispersivity αᵢ + De/v (an approximation).',
  },
  {
    id: 'domenico',
    text: 'Domenico (1987) is an approximation: along the flow it keeps only the leading term of the Ogata–Banks solution, and it evaluates transverse spreading at the travel distance x instead of the travel time; it departs from the exact solution most where longitudinal dispersivity is large, near the source and ahead of the front, so the exact rectangular-source solution is always available beside it.',
  },
  {
    id: 'exact',
    text: 'The exact rectangular-source solution integrates the point-source response over time by numerical quadrature; it is exact for the model above to the stated quadrature tolerance, not for the real aquifer.',
  },
  {
    id: 'boundary',
    text: 'The water table is a no-flux upper boundary (mirror image); the aquifer has no lower boundary, so where a shallow aquifer base stops the plume spreading downwards, concentrations can be higher than shown.',
  },
  {
    id: 'receptor',
    text: 'A receptor concentration is the average over its screen interval below the water table; a pumping well would mix in water from beyond that interval and its capture is not represented.',
  },
]);

/**
 * What the pumping-well figures (capture zones, source capture, travel times, particle figures)
 * assume on top of the above; shown with those figures wherever they appear.
 */
export const WELL_FIELD_ASSUMPTIONS: readonly Assumption[] = Object.freeze([
  {
    id: 'wells-steady',
    text: 'Pumping wells and boundaries: the flow is steady (every well has pumped at its stated rate long enough for the drawdown to settle) and two-dimensional, in a homogeneous aquifer of constant saturated thickness (confined, or unconfined with the drawdown small against the thickness).',
  },
  {
    id: 'wells-penetrating',
    text: 'Wells are fully penetrating: each draws evenly over the whole saturated thickness, so its water and the particle figures are depth averages, diluted by clean water drawn from depths the plume has not reached.',
  },
  {
    id: 'wells-boundaries',
    text: 'A stream, lake shore or barrier is idealised as a straight, infinitely long, fully penetrating line (image wells; Ferris et al. 1962): a constant-head line supplies whatever water the wells draw from it, without a clogging bed.',
  },
  {
    id: 'wells-particles',
    text: 'Particle figures carry a statistical error (given beside each) and come from a source releasing its mass flux v·C0 across the source plane, which near the source and the front differs from the held source concentration of the analytical solutions by a few per cent.',
  },
]);

/** The caution and the assumptions as plain text lines (CLI and report footers). */
export function cautionLines(): string[] {
  return [SCREENING_CAUTION, '', 'Assumptions:', ...ASSUMPTIONS.map((a) => `- ${a.text}`)];
}
