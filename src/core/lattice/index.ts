/**
 * The lattice error function's one entry point (README.md): lateral factors of a row of evenly
 * spaced y values. Nothing outside src/core/lattice imports the files behind it.
 */
export { lateralLattice } from './lateral';
