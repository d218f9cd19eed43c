// Types for decimal-special.mjs (reference evaluations for the tests).
import type Decimal from 'decimal.js';
export type DecimalCtor = typeof Decimal;
export function makeDecimal(digits: number): DecimalCtor;
export function exactDecimal(D: DecimalCtor, x: number): Decimal;
export function erfcD(D: DecimalCtor, a: Decimal.Value): Decimal;
export function erfD(D: DecimalCtor, a: Decimal.Value): Decimal;
export function erfcxD(D: DecimalCtor, a: Decimal.Value): Decimal;
export function erfcBothWays(D: DecimalCtor, a: Decimal.Value): { bySeries: Decimal; byFraction: Decimal };
