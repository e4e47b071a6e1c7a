import { describe, expect, it } from "vitest";
import {
  buildAxis,
  CALENDAR_STEPS,
  calendarStepSeconds,
  calendarTickValues,
  civilFromDays,
  daysFromCivil,
  formatCalendarLabel,
  textWidthPx,
  type CalendarStep,
} from "../../src/render/index.js";

// The reference throughout is ECMAScript's Date (ECMA-262, "Time Values and Time Range"): a time
// value counts milliseconds since 1970-01-01T00:00:00Z with every day 86 400 000 ms long and the
// proleptic Gregorian calendar, the same Unix time the axis uses. toISOString writes the
// ISO 8601 extended format YYYY-MM-DDTHH:mm:ss.sssZ.
const DAY_S = 86_400;
const iso = (t: number): string => new Date(t * 1000).toISOString();

// POSIX time of 2000-01-01T00:00:00Z and of 2024-09-17T07:05:00Z, both checked with GNU date
// (`date -u -d @946684800`, `date -u -d @1726556700`).
const Y2K_S = 946_684_800;
const SEPT_17_0705_S = 1_726_556_700;

/** A small linear congruential generator (Numerical Recipes constants), for repeatable draws. */
function random(seed: number): () => number {
  let state = seed;
  return () => {
    state = (state * 1664525 + 1013904223) % 4294967296;
    return state / 4294967296;
  };
}

/** The label precision of a unit, as the number of leading characters of toISOString it keeps. */
function isoPrefix(t: number, step: CalendarStep): string {
  const text = iso(t).replace("T", " ");
  const keep = { year: 4, month: 7, day: 10, week: 10, hour: 16, minute: 16, second: 19 }[step.unit];
  return text.slice(0, keep);
}

/** Whether `t` is a boundary of `step` according to Date's own UTC fields. */
function onBoundary(t: number, step: CalendarStep): boolean {
  const d = new Date(t * 1000);
  const clock = [d.getUTCHours(), d.getUTCMinutes(), d.getUTCSeconds(), d.getUTCMilliseconds()];
  const zeroFrom = (i: number): boolean => clock.slice(i).every((v) => v === 0);
  const n = step.count;
  switch (step.unit) {
    case "second":
      return zeroFrom(3) && d.getUTCSeconds() % n === 0;
    case "minute":
      return zeroFrom(2) && d.getUTCMinutes() % n === 0;
    case "hour":
      return zeroFrom(1) && d.getUTCHours() % n === 0;
    case "day":
      return zeroFrom(0) && Math.round(t / DAY_S) % n === 0;
    case "week":
      // ISO 8601 weeks start on Monday (getUTCDay() = 1).
      return zeroFrom(0) && d.getUTCDay() === 1;
    case "month":
      return zeroFrom(0) && d.getUTCDate() === 1 && d.getUTCMonth() % n === 0;
    case "year":
      return zeroFrom(0) && d.getUTCDate() === 1 && d.getUTCMonth() === 0 && d.getUTCFullYear() % n === 0;
  }
}

/** Every boundary of a month or year step in [minS, maxS], enumerated with Date.UTC. */
function monthStartsByDate(minS: number, maxS: number, everyMonths: number): number[] {
  const out: number[] = [];
  const first = new Date(minS * 1000);
  for (let m = first.getUTCFullYear() * 12 - 12; ; m++) {
    const t = Date.UTC(Math.floor(m / 12), m % 12, 1) / 1000;
    if (t > maxS) return out;
    if (t >= minS && m % everyMonths === 0) out.push(t);
  }
}

describe("civilFromDays / daysFromCivil (Hinnant's date algorithms, checked against ECMAScript Date)", () => {
  it("daysFromCivil(2000, 1, 1) is 10957 days: 946684800 s / 86400 (POSIX time of 2000-01-01, GNU date)", () => {
    expect(daysFromCivil(2000, 1, 1)).toBe(Y2K_S / DAY_S);
    expect(civilFromDays(0)).toEqual({ year: 1970, month: 1, day: 1 });
  });

  it("civilFromDays agrees with Date on 20 000 days from 1600 to 2400, across century and leap days", () => {
    const next = random(7);
    const lo = Date.UTC(1600, 0, 1) / 86_400_000;
    const hi = Date.UTC(2400, 11, 31) / 86_400_000;
    const days = [lo, hi, Date.UTC(1900, 1, 28) / 86_400_000, Date.UTC(2000, 1, 29) / 86_400_000, Date.UTC(2100, 2, 1) / 86_400_000, -1];
    for (let i = 0; i < 20_000; i++) days.push(Math.floor(lo + next() * (hi - lo)));
    for (const n of days) {
      const d = new Date(n * 86_400_000);
      const expected = { year: d.getUTCFullYear(), month: d.getUTCMonth() + 1, day: d.getUTCDate() };
      expect(civilFromDays(n)).toEqual(expected);
      expect(daysFromCivil(expected.year, expected.month, expected.day)).toBe(n);
    }
  });
});

describe("calendarTickValues / formatCalendarLabel", () => {
  it("calendarTickValues lists exactly the boundaries of every step inside a range, ticks on UTC calendar boundaries", () => {
    const next = random(11);
    for (const step of CALENDAR_STEPS) {
      for (let trial = 0; trial < 5; trial++) {
        // A range of 2 to 30 steps starting anywhere from 1950 to 2050.
        const unitS = { second: 1, minute: 60, hour: 3600, day: DAY_S, week: 7 * DAY_S, month: 30 * DAY_S, year: 365 * DAY_S }[step.unit];
        const minS = -631_152_000 + next() * 3_155_760_000 + next();
        const maxS = minS + (2 + 28 * next()) * step.count * unitS;
        const values = calendarTickValues(minS, maxS, step);
        expect(values.length, `${step.count} ${step.unit}`).toBeGreaterThan(0);
        for (const t of values) {
          expect(t).toBeGreaterThanOrEqual(minS);
          expect(t).toBeLessThanOrEqual(maxS);
          expect(onBoundary(t, step), `${iso(t)} on a ${step.count} ${step.unit} boundary`).toBe(true);
        }
        if (step.unit === "month" || step.unit === "year") {
          expect(values).toEqual(monthStartsByDate(minS, maxS, step.unit === "year" ? 12 * step.count : step.count));
        } else {
          // Fixed-length steps: consecutive ticks one step apart, and none missing at either end.
          const lengthS = step.count * unitS;
          for (let i = 1; i < values.length; i++) expect((values[i] ?? 0) - (values[i - 1] ?? 0)).toBe(lengthS);
          expect((values[0] ?? 0) - lengthS).toBeLessThan(minS);
          expect((values[values.length - 1] ?? 0) + lengthS).toBeGreaterThan(maxS);
        }
      }
    }
  });

  it("month ticks over February 2024 (a leap year) fall on 2024-03-01T00:00:00Z = 1709251200 s (GNU date); ends are inclusive", () => {
    // From noon on the first of January (that month's start lies before the range) to the first instant of May.
    const values = calendarTickValues(Date.UTC(2024, 0, 1, 12) / 1000, Date.UTC(2024, 4, 1) / 1000, { unit: "month", count: 1 });
    expect(values).toContain(1_709_251_200);
    expect(values.map(iso)).toEqual(["2024-02-01T00:00:00.000Z", "2024-03-01T00:00:00.000Z", "2024-04-01T00:00:00.000Z", "2024-05-01T00:00:00.000Z"]);
  });

  it("formatCalendarLabel(2024-09-17T07:05Z) is '2024-09-17 07:05' by minutes, '2024-09-17' by days, '2024-09' by months", () => {
    expect(formatCalendarLabel(SEPT_17_0705_S, { unit: "minute", count: 5 })).toBe("2024-09-17 07:05");
    expect(formatCalendarLabel(SEPT_17_0705_S, { unit: "second", count: 30 })).toBe("2024-09-17 07:05:00");
    expect(formatCalendarLabel(SEPT_17_0705_S - 7 * 3600 - 300, { unit: "day", count: 1 })).toBe("2024-09-17");
    expect(formatCalendarLabel(Date.UTC(2024, 8, 1) / 1000, { unit: "month", count: 1 })).toBe("2024-09");
    expect(formatCalendarLabel(Y2K_S, { unit: "year", count: 5 })).toBe("2000");
  });

  it("formatCalendarLabel of every tick is toISOString cut to the step's precision, 'T' as a space", () => {
    const next = random(23);
    for (const step of CALENDAR_STEPS.filter((s) => s.count <= 10)) {
      const minS = -631_152_000 + next() * 3_155_760_000;
      for (const t of calendarTickValues(minS, minS + 6 * calendarStepSeconds(step), step)) expect(formatCalendarLabel(t, step)).toBe(isoPrefix(t, step));
    }
  });

  it("calendarTickValues throws RangeError for a reversed range or a step that would list too many ticks", () => {
    expect(() => calendarTickValues(10, 0, { unit: "day", count: 1 })).toThrow(RangeError);
    expect(() => calendarTickValues(0, 1e9, { unit: "second", count: 1 })).toThrow(RangeError);
  });
});

/** Spans of a history figure and the label each should get (common practice for time axes). */
const SPANS: readonly { spanS: number; format: RegExp; what: string }[] = [
  { spanS: 40 * 60, format: /^\d{4}-\d{2}-\d{2} \d{2}:\d{2}$/, what: "40 minutes" },
  { spanS: 10 * 3600, format: /^\d{4}-\d{2}-\d{2} \d{2}:\d{2}$/, what: "10 hours" },
  // 3 days: by days, or by hours where the labels are narrow enough for 12 h steps.
  { spanS: 3 * DAY_S, format: /^\d{4}-\d{2}-\d{2}( \d{2}:\d{2})?$/, what: "3 days" },
  { spanS: 20 * DAY_S, format: /^\d{4}-\d{2}-\d{2}$/, what: "20 days" },
  { spanS: 150 * DAY_S, format: /^\d{4}-\d{2}$/, what: "5 months" },
  { spanS: 700 * DAY_S, format: /^\d{4}-\d{2}$/, what: "23 months" },
  { spanS: 8 * 365 * DAY_S, format: /^\d{4}$/, what: "8 years" },
  { spanS: 60 * 365 * DAY_S, format: /^\d{4}$/, what: "60 years" },
];

describe("buildAxis({ kind: 'time-utc' })", () => {
  it("buildAxis(time-utc) is titled 'name (UTC)' and gives 3 to 10 ticks on calendar boundaries whose labels fit", () => {
    const start = Date.UTC(2024, 8, 17, 7, 3, 20) / 1000;
    // The plot widths of a 640 × 420 figure (scale 1) and a 1200 × 800 one (scale 2).
    for (const [lengthPx, textScale] of [
      [560, 1],
      [1050, 2],
    ] as const) {
      for (const { spanS, format, what } of SPANS) {
        const axis = buildAxis({ min: start, max: start + spanS, quantity: { kind: "time-utc" }, name: "Date", lengthPx, orientation: "horizontal", textScale });
        const context = `${what} on ${lengthPx} px`;
        expect(axis.title).toBe("Date (UTC)");
        expect(axis.ticks.length, context).toBeGreaterThanOrEqual(3);
        expect(axis.ticks.length, context).toBeLessThanOrEqual(10);
        for (const t of axis.ticks) {
          expect(t.label, context).toMatch(format);
          // The tick is the label's instant itself: every field of toISOString after the label is at its start.
          const rest = iso(t.value).replace("T", " ").slice(t.label.length);
          expect(rest, `${context}: ${iso(t.value)}`).toMatch(/^(-01){0,2}( 00)?(:00){0,2}\.000Z$/);
        }
        // Neighbouring labels, centred on their ticks, keep two figure widths ("00") apart (px = length · Δv / span).
        for (let i = 1; i < axis.ticks.length; i++) {
          const a = axis.ticks[i - 1]!;
          const b = axis.ticks[i]!;
          const gapPx = ((b.value - a.value) / spanS) * lengthPx - (textWidthPx(a.label, textScale) + textWidthPx(b.label, textScale)) / 2;
          expect(gapPx, context).toBeGreaterThanOrEqual(textWidthPx("00", textScale) - 1e-9);
        }
      }
    }
  });
});
