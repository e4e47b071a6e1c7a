/**
 * Ticks on a calendar-time axis whose values are Unix time: seconds since 1970-01-01T00:00:00Z,
 * every day 86 400 s long (leap seconds are not counted, as in POSIX time and ECMAScript's Date).
 * Ticks fall on whole UTC seconds, minutes, hours, midnights, Mondays (the first day of the week
 * in ISO 8601), first days of months or of years; labels are written in the ISO 8601 extended
 * calendar format, cut to the precision of the step, with a space in place of "T".
 */
import { civilFromDays, daysFromCivil } from "./civilDate.js";

/** The calendar unit a step counts. */
export type CalendarUnit = "second" | "minute" | "hour" | "day" | "week" | "month" | "year";

/** A tick step of `count` calendar units, e.g. { unit: "hour", count: 6 }. */
export interface CalendarStep {
  readonly unit: CalendarUnit;
  readonly count: number;
}

const SECONDS_PER_DAY = 86_400;
// 1970-01-05, the first Monday after the epoch (1970-01-01 was a Thursday).
const FIRST_MONDAY_DAYS = 4;
// Most ticks calendarTickValues will list in one call.
const MAX_LISTED_TICKS = 10_000;

// Length of each unit in seconds; month and year are the Gregorian means (365.2425 d a year).
const UNIT_S: Readonly<Record<CalendarUnit, number>> = {
  second: 1,
  minute: 60,
  hour: 3_600,
  day: SECONDS_PER_DAY,
  week: 7 * SECONDS_PER_DAY,
  month: (365.2425 * SECONDS_PER_DAY) / 12,
  year: 365.2425 * SECONDS_PER_DAY,
};

function stepsOf(unit: CalendarUnit, counts: readonly number[]): CalendarStep[] {
  return counts.map((count) => ({ unit, count }));
}

/**
 * The steps a time axis may use, shortest first. Second, minute and hour counts divide the next
 * unit, so their ticks keep to round clock times; 2-day ticks count from 1970-01-01 and
 * 2-week ones from Monday 1970-01-05.
 */
export const CALENDAR_STEPS: readonly CalendarStep[] = [
  ...stepsOf("second", [1, 2, 5, 10, 15, 30]),
  ...stepsOf("minute", [1, 2, 5, 10, 15, 30]),
  ...stepsOf("hour", [1, 2, 3, 6, 12]),
  ...stepsOf("day", [1, 2]),
  ...stepsOf("week", [1, 2]),
  ...stepsOf("month", [1, 3, 6]),
  ...stepsOf("year", [1, 2, 5, 10, 20, 50, 100, 200, 500, 1000]),
];

/** Length of `step` in seconds; for months and years the Gregorian mean, not any one month's. */
export function calendarStepSeconds(step: CalendarStep): number {
  return step.count * UNIT_S[step.unit];
}

// offset + k·length for every integer k with the value inside [minS, maxS].
function evenTicks(minS: number, maxS: number, lengthS: number, offsetS: number): number[] {
  const values: number[] = [];
  for (let k = Math.ceil((minS - offsetS) / lengthS); offsetS + k * lengthS <= maxS; k++) values.push(offsetS + k * lengthS);
  return values;
}

// The first instants of the months whose index (12·year + month − 1) is a multiple of `every`.
function monthTicks(minS: number, maxS: number, every: number): number[] {
  const start = civilFromDays(Math.floor(minS / SECONDS_PER_DAY));
  const values: number[] = [];
  for (let m = Math.ceil((12 * start.year + start.month - 1) / every) * every; ; m += every) {
    const year = Math.floor(m / 12);
    const t = daysFromCivil(year, m - 12 * year + 1, 1) * SECONDS_PER_DAY;
    if (t > maxS) return values;
    if (t >= minS) values.push(t);
  }
}

/**
 * The instants of `step` inside [minS, maxS] (Unix time, s), ascending: multiples of the step
 * from the epoch for seconds to days, every count-th Monday from 1970-01-05 for weeks, the
 * first of every count-th month (January first) for months, 1 January of the years divisible
 * by the count for years.
 * Throws RangeError for a range that is not finite with max ≥ min, or one that would list more
 * than 10 000 ticks.
 */
export function calendarTickValues(minS: number, maxS: number, step: CalendarStep): number[] {
  if (!Number.isFinite(minS) || !Number.isFinite(maxS) || !(maxS >= minS)) throw new RangeError(`calendarTickValues: range [${minS}, ${maxS}] must be finite with max ≥ min`);
  if (!Number.isInteger(step.count) || step.count < 1) throw new RangeError(`calendarTickValues: step count ${step.count} must be a positive integer`);
  const expected = (maxS - minS) / calendarStepSeconds(step);
  if (expected > MAX_LISTED_TICKS) throw new RangeError(`calendarTickValues: ${step.count} ${step.unit} steps over ${maxS - minS} s would make about ${Math.round(expected)} ticks; at most ${MAX_LISTED_TICKS}`);
  if (step.unit === "month") return monthTicks(minS, maxS, step.count);
  if (step.unit === "year") return monthTicks(minS, maxS, 12 * step.count);
  if (step.unit === "week") return evenTicks(minS, maxS, calendarStepSeconds(step), FIRST_MONDAY_DAYS * SECONDS_PER_DAY);
  return evenTicks(minS, maxS, calendarStepSeconds(step), 0);
}

function pad(n: number, width: number): string {
  return n < 0 ? `-${String(-n).padStart(width, "0")}` : String(n).padStart(width, "0");
}

/**
 * The label of the instant `valueS` (Unix time, s) on an axis stepping by `step`, in UTC:
 * "2024" for years, "2024-09" for months, "2024-09-17" for days and weeks, "2024-09-17 07:05"
 * for hours and minutes, "2024-09-17 07:05:30" for seconds (ISO 8601 extended format, the
 * "T" written as a space). Fractions of a second are dropped.
 */
export function formatCalendarLabel(valueS: number, step: CalendarStep): string {
  const days = Math.floor(valueS / SECONDS_PER_DAY);
  const { year, month, day } = civilFromDays(days);
  const secondOfDay = Math.floor(valueS - days * SECONDS_PER_DAY);
  if (step.unit === "year") return pad(year, 4);
  if (step.unit === "month") return `${pad(year, 4)}-${pad(month, 2)}`;
  const date = `${pad(year, 4)}-${pad(month, 2)}-${pad(day, 2)}`;
  if (step.unit === "day" || step.unit === "week") return date;
  const clock = `${pad(Math.floor(secondOfDay / 3600), 2)}:${pad(Math.floor(secondOfDay / 60) % 60, 2)}`;
  return step.unit === "second" ? `${date} ${clock}:${pad(secondOfDay % 60, 2)}` : `${date} ${clock}`;
}
