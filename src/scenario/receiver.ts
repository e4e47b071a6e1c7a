/**
 * A receiver model for synthetic captures: IQ gain and phase imbalance, then a DC offset, applied
 * to the ideal baseband (signal plus front-end noise). Real direct-conversion receivers show
 * both (a DC spike at 0 Hz and a mirror image of each emission at −f).
 */

/** Receiver imperfections. */
export interface ReceiverModel {
  /** DC offset added to I and to Q, full scale 1.0. */
  readonly dcI: number;
  readonly dcQ: number;
  /** Q-branch gain relative to I, dB: g = 10^(gainImbalanceDb/20). */
  readonly gainImbalanceDb: number;
  /** Q-branch phase error φ, degrees. */
  readonly phaseImbalanceDeg: number;
}

/**
 * Applies the model: I' = I + dcI,  Q' = g·(Q cos φ + I sin φ) + dcQ (the sign convention of the
 * health figures, docs/methods.md: positive φ turns a tone into cos θ + j·g·sin(θ + φ)).
 * A tone exp(jθ) becomes ½(1 + g e^{jφ}) e^{jθ} + ½(1 − g e^{−jφ}) e^{−jθ}, so the image at −f
 * lies below the tone by the image-rejection ratio
 *   IRR = (1 + 2g cos φ + g²) / (1 − 2g cos φ + g²)
 * (derived here; the same expression appears in RF-receiver textbooks, e.g. Razavi,
 * "RF Microelectronics", image rejection, from memory). Returns a new array.
 */
export function applyReceiver(iq: Float64Array, model: ReceiverModel): Float64Array {
  const g = 10 ** (model.gainImbalanceDb / 20);
  const phi = (model.phaseImbalanceDeg * Math.PI) / 180;
  const gc = g * Math.cos(phi);
  const gs = g * Math.sin(phi);
  const out = new Float64Array(iq.length);
  for (let k = 0; k < iq.length; k += 2) {
    const i = iq[k] as number;
    const q = iq[k + 1] as number;
    out[k] = i + model.dcI;
    out[k + 1] = gc * q + gs * i + model.dcQ;
  }
  return out;
}

/** The image-rejection ratio of `model` in dB: 10·log10 of the IRR formula of `applyReceiver`. */
export function imageRejectionDb(model: ReceiverModel): number {
  const g = 10 ** (model.gainImbalanceDb / 20);
  const c = Math.cos((model.phaseImbalanceDeg * Math.PI) / 180);
  return 10 * Math.log10((1 + 2 * g * c + g * g) / (1 - 2 * g * c + g * g));
}
