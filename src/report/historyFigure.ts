/**
 * history.png: one figure of a transmitter's archived entries over calendar time (UTC): each
 * value with its expanded-uncertainty bar (k = 2), joined in time order, and the limit line(s)
 * when there is a limit (both signs for a symmetric tolerance such as a frequency error).
 */
import { renderLineFigure, type MarkerLine } from "../render/index.js";
import type { HistoryPoint } from "../archive/index.js";

export interface HistoryFigureInput {
  readonly tag: string;
  readonly field: string;
  readonly points: readonly HistoryPoint[];
  readonly limit: { readonly value: number; readonly source: string; readonly symmetric: boolean } | null;
}

export function historyFigure(h: HistoryFigureInput): Buffer {
  const xs = h.points.map((p) => Date.parse(p.time) / 1000);
  const ys = h.points.map((p) => p.value);
  const errors = h.points.map((p) => (p.uncertainty !== null && p.uncertainty > 0 && Number.isFinite(p.uncertainty) ? p.uncertainty : NaN));
  const markers: MarkerLine[] = [];
  if (h.limit !== null) {
    markers.push({ orientation: "horizontal", value: h.limit.value, label: `limit ${h.limit.value}` });
    if (h.limit.symmetric) markers.push({ orientation: "horizontal", value: -h.limit.value, label: `limit −${h.limit.value}` });
  }
  const unit = unitOf(h.field);
  return renderLineFigure({
    title: `History of ${h.field}: ${h.tag}`,
    subtitle: `${h.points.length} archived entries; bars: U (k = 2)${h.limit === null ? "" : h.limit.source === "--limit" ? "; limit given" : "; limit of the latest check"}`,
    x: { name: "Time", quantity: { kind: "time-utc" } },
    y: { name: h.field, quantity: { kind: "linear", unit } },
    series: [],
    points: [{ label: `${h.field} ± U`, xValues: xs, yValues: ys, yErrors: errors, joined: true }],
    markers,
    widthPx: 1200,
    heightPx: 700,
  }).png;
}

/** The unit a report field's name carries (interface.md: units in names). */
function unitOf(field: string): string {
  const units: [RegExp, string][] = [[/Ppm$/, "ppm"], [/Hz$/, "Hz"], [/Dbfs$/, "dBFS"], [/Dbc$/, "dBc"], [/Db$/, "dB"], [/Percent$/, "%"], [/Bd$/, "Bd"], [/S$/, "s"]];
  for (const [re, u] of units) if (re.test(field)) return u;
  return "";
}
