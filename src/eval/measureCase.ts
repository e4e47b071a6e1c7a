/**
 * Measures one evaluation capture exactly as `iqaudit measure <capture>` does with no hints (the
 * rate and centre come from the file name; no --nominal, --mode, --order, --symbol-rate or
 * --channel; default x dB and audio bandwidth), and reads the figures compared with the truth.
 */
import { measureCommand } from "../commands/measure.js";
import { QUANTITIES, QUANTITY_PATH, type EvalCase, type Quantity } from "./truth.js";

/** A measured figure beside its truth: null value = not measured, null uncertainty = none stated. */
export interface Compared {
  readonly truth: number;
  readonly value: number | null;
  readonly uncertainty: number | null;
}

export interface CaseResult extends EvalCase {
  /** The measured class with its order where it has one (fsk2, psk8, qam16, …), "unknown" or "noise". */
  readonly measuredLabel: string;
  readonly confidence: number;
  readonly compared: Readonly<Partial<Record<Quantity, Compared>>>;
  readonly measuredSnrDb: number | null;
  /** The error thrown, when the measurement failed (a defect: scored as "error"). */
  readonly error: string | null;
}

/** The label of a measured class: digital classes carry their order ("fsk?" when it is not known). */
export function measuredLabelOf(cls: string, order: number | null): string {
  if (cls === "fsk" || cls === "psk" || cls === "qam") return `${cls}${order ?? "?"}`;
  return cls;
}

export async function measureCase(c: EvalCase & { readonly path: string }): Promise<CaseResult> {
  try {
    const { report } = await measureCommand(c.path, { capture: {} });
    const flat = report as unknown as Record<string, Record<string, unknown> | null>;
    const compared: Partial<Record<Quantity, Compared>> = {};
    for (const q of QUANTITIES) {
      const truth = c.truth.figures[q];
      if (truth === null) continue;
      const path = QUANTITY_PATH[q];
      const [section, field] = path.split(".") as [string, string];
      const v = flat[section]?.[field];
      compared[q] = {
        truth,
        value: typeof v === "number" ? v : null,
        uncertainty: report.uncertainty[path] ?? null,
      };
    }
    return {
      ...c,
      measuredLabel: measuredLabelOf(report.modulation.class, report.modulation.order),
      confidence: report.modulation.confidence,
      compared,
      measuredSnrDb: report.power.snrDb,
      error: null,
    };
  } catch (e) {
    const message = e instanceof Error ? e.message : String(e);
    return { ...c, measuredLabel: "error", confidence: 0, compared: {}, measuredSnrDb: null, error: message };
  }
}
