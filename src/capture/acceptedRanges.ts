/**
 * The sample rates and centre frequencies iqaudit accepts, wherever they come from (--rate,
 * --center, a SigMF field, a WAV fmt chunk, a file-name token); docs/formats.md, "Accepted
 * ranges", says why.
 *
 * Sample rate, 1 kS/s to 1 TS/s: the slowest IQ captures in use are sound-card recordings at
 * 8 kS/s (the telephony rate) and narrow channels decimated further, to a few kS/s around a keyed
 * carrier; a rate under 1 kS/s is in practice a value typed without its prefix (`--rate 500` for
 * 500k) and a fraction of a sample per second is no capture at all. The fastest digitisers
 * sample at a few hundred GS/s (from memory); 1 TS/s is beyond every one of them.
 * Centre, 0 Hz (a baseband capture) to 3 THz: radio waves are those below 3 000 GHz (ITU Radio
 * Regulations, Article 1, No. 1.5; from memory).
 */

export const SAMPLE_RATE_MIN_HZ = 1e3;
export const SAMPLE_RATE_MAX_HZ = 1e12;
export const CENTER_MIN_HZ = 0;
export const CENTER_MAX_HZ = 3e12;

/**
 * Why `rateHz` (samples/s) is not an accepted sample rate, as a predicate that follows the value
 * ("500 " + "is below 1 kS/s, …"), or null when it is accepted.
 */
export function sampleRateProblem(rateHz: number): string | null {
  if (!(Number.isFinite(rateHz) && rateHz > 0)) return "is not a sample rate: it must be a positive, finite number of samples/s";
  if (rateHz < SAMPLE_RATE_MIN_HZ) return "is below 1 kS/s, the lowest sample rate iqaudit accepts (docs/formats.md)";
  if (rateHz > SAMPLE_RATE_MAX_HZ) return "is above 1 TS/s, the highest sample rate iqaudit accepts (docs/formats.md)";
  return null;
}

/** Why `centerHz` is not an accepted centre frequency, as a predicate that follows the value, or null. */
export function centerProblem(centerHz: number): string | null {
  if (!Number.isFinite(centerHz)) return "is not a finite frequency in Hz";
  if (centerHz < CENTER_MIN_HZ || centerHz > CENTER_MAX_HZ) {
    return "is outside 0 Hz to 3 THz, the centre frequencies iqaudit accepts (docs/formats.md)";
  }
  return null;
}
