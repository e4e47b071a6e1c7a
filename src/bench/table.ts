/**
 * The benchmark's tables: one row a run, with its rate in MS/s and GB/s, its time, its peak RSS
 * and a note; numbers right-aligned under a header, a blank where a row has no such figure.
 */

export interface TableRow {
  readonly label: string;
  /** Complex samples a second, millions. */
  readonly msps?: number;
  /** Bytes of the capture a second, 10^9. */
  readonly gbps?: number;
  readonly seconds?: number;
  readonly rssMiB?: number;
  readonly note?: string;
}

const COLUMNS = [
  { title: "MS/s", width: 8, digits: 1, pick: (r: TableRow) => r.msps },
  { title: "GB/s", width: 6, digits: 2, pick: (r: TableRow) => r.gbps },
  { title: "time s", width: 7, digits: 2, pick: (r: TableRow) => r.seconds },
  { title: "RSS MiB", width: 8, digits: 0, pick: (r: TableRow) => r.rssMiB },
] as const;

/** The rows under a header line, each line starting with `indent`. */
export function formatTable(rows: readonly TableRow[], indent = "  "): string {
  const labelWidth = Math.max(3, ...rows.map((r) => r.label.length));
  const header = `${indent}${"run".padEnd(labelWidth)}${COLUMNS.map((c) => c.title.padStart(c.width + 2)).join("")}  notes`;
  const lines = rows.map((r) => {
    const cells = COLUMNS.map((c) => {
      const v = c.pick(r);
      return (v === undefined ? "" : v.toFixed(c.digits)).padStart(c.width + 2);
    });
    return `${indent}${r.label.padEnd(labelWidth)}${cells.join("")}${r.note === undefined ? "" : `  ${r.note}`}`;
  });
  return [header, ...lines].join("\n");
}
