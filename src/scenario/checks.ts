// Parameter checks shared by the synthesis functions (not part of the public surface).
import { ParameterError } from "../errors.js";

/** Throws ParameterError unless `value` is finite and > 0. */
export function requirePositive(name: string, value: number): void {
  if (!(value > 0) || !Number.isFinite(value)) {
    throw new ParameterError(name, `${value} must be a positive finite number`);
  }
}

/** Throws ParameterError unless lo <= value <= hi. */
export function requireRange(name: string, value: number, lo: number, hi: number): void {
  if (!(value >= lo && value <= hi)) {
    throw new ParameterError(name, `${value} must lie in [${lo}, ${hi}]`);
  }
}

/** Throws ParameterError unless `value` is a non-negative integer. */
export function requireCount(name: string, value: number): void {
  if (!Number.isInteger(value) || value < 0) {
    throw new ParameterError(name, `${value} must be a non-negative integer`);
  }
}
