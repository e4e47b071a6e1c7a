/**
 * Emission masks: the highest level allowed at each offset, in dB relative to a reference (the
 * carrier or the highest emission). A licence gives its own points, or names a rule mask of
 * 47 CFR 90.210 (land mobile), 80.211(f) (maritime) or 73.317 (FM broadcast); the formulas are
 * those of REFERENCES.md §4, status V, and docs/licence.md lists them with their sources.
 *
 * A rule's attenuation A dB is an allowed level of −A dB. Zones run "more than X, up to and
 * including Y" as 90.210 words them (73.317's first zone includes its 120 kHz start). Where a
 * rule sets no limit (inside half the authorised bandwidth for B and 80.211(f), inside 120 kHz
 * for 73.317), or where our reference table does not give the rule's near-in zone (C within
 * 5 kHz, G within 10 kHz, I within 6.8 kHz), `allowedDb` is null: nothing is checked there.
 *
 * Power terms: where a zone's limit involves 10 log10(P), alone or as "the lesser of" with fixed
 * terms, and the licence gives no transmitterPowerW, the zone is null as well. The lesser of
 * several attenuations is the weakest requirement, so without P the fixed term alone could fail
 * an emission that the rule passes; the mask's notes say which zones were left out and why.
 */
import { ParameterError } from "../errors.js";
import type { Licence, MaskPoints, MaskReference } from "./licence.js";

export interface Mask {
  readonly name: string;
  readonly description: string;
  readonly reference: MaskReference;
  readonly offsetFrom: "assigned" | "authorised-centre";
  readonly source: string;
  readonly status: string;
  readonly notes: readonly string[];
  /** Offsets (Hz, >= 0) where the limit steps or changes formula: sample both sides of each. */
  readonly edgesHz: readonly number[];
  /** Highest allowed level at |offsetHz| from the mask's origin, dB relative to the reference (<= 0), or null where the mask sets no limit there. */
  allowedDb(offsetHz: number): number | null;
}

type RuleInfo = Pick<Mask, "name" | "description" | "reference" | "offsetFrom" | "source" | "status">;

const RULE_INFO: Readonly<Record<string, RuleInfo>> = Object.fromEntries(([
  ["cfr-90.210-b", "land-mobile mask B (25 kHz equipment with an audio low-pass filter): 25 dB, then 35 dB below the carrier in steps of the authorised bandwidth, then 43 + 10 log10(P) dB", "carrier", "assigned", "47 CFR 90.210(b)"],
  ["cfr-90.210-c", "land-mobile mask C (25 kHz equipment without an audio low-pass filter): 83 log10(fd/5) dB from 5 to 10 kHz, 29 log10(fd²/11) dB capped at 50 dB to 250 % of the authorised bandwidth, then 43 + 10 log10(P) dB", "carrier", "authorised-centre", "47 CFR 90.210(c)"],
  ["cfr-90.210-d", "land-mobile mask D (12.5 kHz equipment): below the highest emission, 7.27(fd − 2.88 kHz) dB from 5.625 to 12.5 kHz, then the lesser of 50 + 10 log10(P) and 70 dB", "peak", "authorised-centre", "47 CFR 90.210(d)"],
  ["cfr-90.210-e", "land-mobile mask E (6.25 kHz equipment): below the highest emission, 30 + 16.67(fd − 3 kHz) dB from 3 to 4.6 kHz, then 55 + 10 log10(P) dB, each at most 65 dB", "peak", "authorised-centre", "47 CFR 90.210(e)"],
  ["cfr-90.210-g", "land-mobile mask G: 116 log10(fd/6.1) dB from 10 kHz to 250 % of the authorised bandwidth (at most 50 + 10 log10(P) and 70 dB), then 43 + 10 log10(P) dB", "carrier", "authorised-centre", "47 CFR 90.210(g)"],
  ["cfr-90.210-h", "land-mobile mask H: 107 log10(fd/4), 40.5 log10(fd/1.16) and 116 log10(fd/6.1) dB from 4 to 25 kHz, then 43 + 10 log10(P) dB", "carrier", "authorised-centre", "47 CFR 90.210(h)"],
  ["cfr-90.210-i", "land-mobile mask I: 25 dB from 6.8 kHz, 35 dB from 9 kHz, then the lesser of 43 + 10 log10(P) and 70 dB", "carrier", "assigned", "47 CFR 90.210(i)"],
  ["cfr-80.211-f", "maritime mask for emissions other than single sideband (VHF F3E/G3E): below the mean output power, 25 dB, then 35 dB in steps of the authorised bandwidth, then 43 + 10 log10(P) dB", "carrier", "assigned", "47 CFR 80.211(f)"],
  ["cfr-73.317", "FM broadcast: below the unmodulated carrier, 25 dB from 120 to 240 kHz, 35 dB to 600 kHz, then the lesser of 43 + 10 log10(P) and 80 dB", "carrier", "assigned", "47 CFR 73.317(b)–(d)"],
] as const).map(([name, description, reference, offsetFrom, source]) => [name, { name, description, reference, offsetFrom, source, status: "V" }]));

/** The names a licence's `mask` may give instead of points. */
export const RULE_MASK_NAMES: readonly string[] = Object.keys(RULE_INFO);

/** The reference and source of rule mask `name`, or null for a name that is not a rule mask. */
export function ruleMaskReference(name: string): { reference: MaskReference; source: string } | null {
  const info = RULE_INFO[name];
  return info === undefined ? null : { reference: info.reference, source: info.source };
}

/** One zone: up to `toHz` (Hz; included unless `includesTo` is false), attenuation A(fdHz) dB or null for no limit. */
interface Zone {
  readonly toHz: number;
  readonly includesTo: boolean;
  readonly attenuationDb: ((fdHz: number) => number) | null;
}

function zone(toHz: number, attenuationDb: ((fdHz: number) => number) | null, includesTo = true): Zone {
  return { toHz, includesTo, attenuationDb };
}

function zonedMask(info: RuleInfo, notes: readonly string[], zones: readonly Zone[]): Mask {
  return {
    ...info,
    notes,
    edgesHz: zones.map((z) => z.toHz).filter(Number.isFinite),
    allowedDb(offsetHz: number): number | null {
      const f = absoluteOffset(offsetHz);
      const z = zones.find((c) => f < c.toHz || (c.includesTo && f === c.toHz)) as Zone;
      return z.attenuationDb === null ? null : levelOf(z.attenuationDb(f));
    },
  };
}

function absoluteOffset(offsetHz: number): number {
  if (!Number.isFinite(offsetHz)) throw new RangeError(`mask offset ${offsetHz} Hz is not a finite number`);
  return Math.abs(offsetHz);
}

/** Attenuation A dB as the allowed level −A dB (0, never −0). */
function levelOf(attenuationDb: number): number {
  return attenuationDb === 0 ? 0 : -attenuationDb;
}

const kHz = (fdHz: number): number => fdHz / 1000;

/** base + 10 log10(P): the power term of the rules, P in W. */
function powerTermDb(baseDb: number, powerW: number): number {
  return baseDb + 10 * Math.log10(powerW);
}

/** A zone whose limit needs P: null (no limit) without it. */
function withPower(powerW: number | null, attenuation: (powerW: number, fdHz: number) => number): ((fdHz: number) => number) | null {
  return powerW === null ? null : (fdHz) => attenuation(powerW, fdHz);
}

function noPowerNote(where: string, term: string): string {
  return `${where} the limit is ${term}: not applied, the licence gives no transmitterPowerW`;
}

function checkBandwidth(name: string, authorisedBandwidthHz: number, minimumHz = 0): void {
  if (!Number.isFinite(authorisedBandwidthHz) || !(authorisedBandwidthHz > minimumHz)) {
    throw new ParameterError("authorisedBandwidthHz", `mask ${name} needs a finite authorised bandwidth above ${minimumHz} Hz, not ${authorisedBandwidthHz}`);
  }
}

function checkPower(powerW: number | null): void {
  if (powerW !== null && (!Number.isFinite(powerW) || !(powerW > 0))) {
    throw new ParameterError("transmitterPowerW", `must be a finite power > 0 W, not ${powerW}`);
  }
}

/** B and 80.211(f): > 50–100 % of the authorised bandwidth 25 dB, > 100–250 % 35 dB, > 250 % 43 + 10 log10(P) dB. */
function percentStepMask(info: RuleInfo, authorisedBandwidthHz: number, powerW: number | null): Mask {
  checkBandwidth(info.name, authorisedBandwidthHz);
  checkPower(powerW);
  const b = authorisedBandwidthHz;
  const notes = [`within 50 % of the authorised bandwidth (${0.5 * b} Hz) the rule sets no limit`];
  if (powerW === null) notes.push(noPowerNote(`beyond 250 % (${2.5 * b} Hz)`, "43 + 10 log10(P) dB"));
  return zonedMask(info, notes, [
    zone(0.5 * b, null),
    zone(b, () => 25),
    zone(2.5 * b, () => 35),
    zone(Infinity, withPower(powerW, (p) => powerTermDb(43, p))),
  ]);
}

/** 47 CFR 90.210(b), mask B (REFERENCES.md §4, V). */
export function mask90210B(authorisedBandwidthHz: number, powerW: number | null): Mask {
  return percentStepMask(RULE_INFO["cfr-90.210-b"] as RuleInfo, authorisedBandwidthHz, powerW);
}

/** 47 CFR 80.211(f), maritime emissions other than SSB, below the mean output power (REFERENCES.md §4, V). */
export function mask80211F(authorisedBandwidthHz: number, powerW: number | null): Mask {
  return percentStepMask(RULE_INFO["cfr-80.211-f"] as RuleInfo, authorisedBandwidthHz, powerW);
}

/** 47 CFR 90.210(c), mask C, fd in kHz from the centre of the authorised bandwidth (REFERENCES.md §4, V). */
export function mask90210C(authorisedBandwidthHz: number, powerW: number | null): Mask {
  checkBandwidth("cfr-90.210-c", authorisedBandwidthHz, 4000); // 250 % must lie beyond the 10 kHz zone
  checkPower(powerW);
  const edgeHz = 2.5 * authorisedBandwidthHz;
  const notes = ["within 5 kHz of the centre no limit is applied (the reference table gives the rule from 5 kHz out)"];
  if (powerW === null) notes.push(noPowerNote(`beyond 250 % of the authorised bandwidth (${edgeHz} Hz)`, "43 + 10 log10(P) dB"));
  return zonedMask(RULE_INFO["cfr-90.210-c"] as RuleInfo, notes, [
    zone(5000, null),
    zone(10000, (f) => 83 * Math.log10(kHz(f) / 5)),
    zone(edgeHz, (f) => Math.min(29 * Math.log10(kHz(f) ** 2 / 11), 50)),
    zone(Infinity, withPower(powerW, (p) => powerTermDb(43, p))),
  ]);
}

/** 47 CFR 90.210(d), mask D, relative to the highest emission in the authorised bandwidth (REFERENCES.md §4, V). */
export function mask90210D(powerW: number | null): Mask {
  checkPower(powerW);
  const notes = powerW === null ? [noPowerNote("beyond 12.5 kHz", "the lesser of 50 + 10 log10(P) and 70 dB")] : [];
  return zonedMask(RULE_INFO["cfr-90.210-d"] as RuleInfo, notes, [
    zone(5625, () => 0),
    zone(12500, (f) => 7.27 * (kHz(f) - 2.88)),
    zone(Infinity, withPower(powerW, (p) => Math.min(powerTermDb(50, p), 70))),
  ]);
}

/** 47 CFR 90.210(e), mask E, relative to the highest emission (REFERENCES.md §4, V). */
export function mask90210E(powerW: number | null): Mask {
  checkPower(powerW);
  const notes = powerW === null ? [noPowerNote("beyond 3 kHz", "the lesser of its formula, 55 + 10 log10(P) and 65 dB")] : [];
  return zonedMask(RULE_INFO["cfr-90.210-e"] as RuleInfo, notes, [
    zone(3000, () => 0),
    zone(4600, withPower(powerW, (p, f) => Math.min(30 + 16.67 * (kHz(f) - 3), powerTermDb(55, p), 65))),
    zone(Infinity, withPower(powerW, (p) => Math.min(powerTermDb(55, p), 65))),
  ]);
}

/** 47 CFR 90.210(g), mask G (REFERENCES.md §4, V). */
export function mask90210G(authorisedBandwidthHz: number, powerW: number | null): Mask {
  checkBandwidth("cfr-90.210-g", authorisedBandwidthHz, 4000); // 250 % must lie beyond 10 kHz
  checkPower(powerW);
  const edgeHz = 2.5 * authorisedBandwidthHz;
  const notes = ["within 10 kHz of the centre no limit is applied (the reference table gives the rule from 10 kHz out)"];
  if (powerW === null) notes.push(noPowerNote("beyond 10 kHz", "the lesser of 116 log10(fd/6.1), 50 + 10 log10(P) and 70 dB, then 43 + 10 log10(P) dB"));
  return zonedMask(RULE_INFO["cfr-90.210-g"] as RuleInfo, notes, [
    zone(10000, null),
    zone(edgeHz, withPower(powerW, (p, f) => Math.min(116 * Math.log10(kHz(f) / 6.1), powerTermDb(50, p), 70))),
    zone(Infinity, withPower(powerW, (p) => powerTermDb(43, p))),
  ]);
}

/** 47 CFR 90.210(h), mask H (REFERENCES.md §4, V). */
export function mask90210H(powerW: number | null): Mask {
  checkPower(powerW);
  const notes = powerW === null ? [noPowerNote("beyond 25 kHz", "43 + 10 log10(P) dB")] : [];
  return zonedMask(RULE_INFO["cfr-90.210-h"] as RuleInfo, notes, [
    zone(4000, () => 0),
    zone(8500, (f) => 107 * Math.log10(kHz(f) / 4)),
    zone(15000, (f) => 40.5 * Math.log10(kHz(f) / 1.16)),
    zone(25000, (f) => 116 * Math.log10(kHz(f) / 6.1)),
    zone(Infinity, withPower(powerW, (p) => powerTermDb(43, p))),
  ]);
}

/** 47 CFR 90.210(i), mask I (REFERENCES.md §4, V). */
export function mask90210I(powerW: number | null): Mask {
  checkPower(powerW);
  const notes = ["within 6.8 kHz no limit is applied (the rule's table starts at 6.8 kHz)"];
  if (powerW === null) notes.push(noPowerNote("beyond 15 kHz", "the lesser of 43 + 10 log10(P) and 70 dB"));
  return zonedMask(RULE_INFO["cfr-90.210-i"] as RuleInfo, notes, [
    zone(6800, null),
    zone(9000, () => 25),
    zone(15000, () => 35),
    zone(Infinity, withPower(powerW, (p) => Math.min(powerTermDb(43, p), 70))),
  ]);
}

/** 47 CFR 73.317(b)–(d), FM broadcast, offsets from the carrier (REFERENCES.md §4, V). */
export function mask73317(powerW: number | null): Mask {
  checkPower(powerW);
  const notes = ["within 120 kHz of the carrier the rule sets no limit"];
  if (powerW === null) notes.push(noPowerNote("beyond 600 kHz", "the lesser of 43 + 10 log10(P) and 80 dB"));
  return zonedMask(RULE_INFO["cfr-73.317"] as RuleInfo, notes, [
    zone(120e3, null, false), // 73.317(b): "between 120 kHz and 240 kHz inclusive"
    zone(240e3, () => 25),
    zone(600e3, () => 35),
    zone(Infinity, withPower(powerW, (p) => Math.min(powerTermDb(43, p), 80))),
  ]);
}

/**
 * Why `points` are not mask points (an array of [offsetHz >= 0, levelDb <= 0] pairs of finite
 * numbers with strictly increasing offsets), or null when they are.
 */
export function maskPointsProblem(points: unknown): string | null {
  const rule = "an array of [offsetHz, levelDbc] pairs";
  if (!Array.isArray(points)) return `must be ${rule}`;
  if (points.length === 0) return `has no points; it must be ${rule}`;
  let previousHz: number | null = null;
  for (const [i, p] of points.entries()) {
    if (!Array.isArray(p) || p.length !== 2 || !p.every((x) => typeof x === "number" && Number.isFinite(x))) {
      return `point ${i} (${JSON.stringify(p) ?? String(p)}) is not an [offsetHz, levelDbc] pair of finite numbers`;
    }
    const [offsetHz, levelDb] = p as [number, number];
    if (offsetHz < 0) return `point ${i} has offset ${offsetHz} Hz; offsets are |offset| from the assigned frequency, >= 0`;
    if (levelDb > 0) return `point ${i} has level ${levelDb} dB; a level is the highest allowed relative to the reference, <= 0`;
    if (previousHz !== null && !(offsetHz > previousHz)) {
      return `point ${i} has offset ${offsetHz} Hz, not above the previous point's ${previousHz} Hz; offsets must strictly increase`;
    }
    previousHz = offsetHz;
  }
  return null;
}

/**
 * A licence's own mask: linear interpolation in dB between the points, the first level below the
 * first point, the last level held beyond the last (docs/interface.md "Licence file"). Offsets
 * from the assigned frequency. Throws ParameterError for points that break maskPointsProblem.
 */
export function pointMask(points: MaskPoints, reference: MaskReference = "carrier"): Mask {
  const problem = maskPointsProblem(points);
  if (problem !== null) throw new ParameterError("mask", problem);
  const copy = points.map(([o, l]) => [o, l] as const);
  return {
    name: "points",
    description: `the licence's own mask of ${copy.length} point${copy.length === 1 ? "" : "s"}, interpolated linearly in dB and held beyond the last`,
    reference,
    offsetFrom: "assigned",
    source: "licence",
    status: "licence",
    notes: [],
    edgesHz: copy.map(([o]) => o),
    allowedDb: (offsetHz) => levelOf(-interpolateDb(copy, absoluteOffset(offsetHz))),
  };
}

function interpolateDb(points: MaskPoints, f: number): number {
  const [f0, l0] = points[0] as readonly [number, number];
  if (f <= f0) return l0;
  for (let i = 1; i < points.length; i++) {
    const [fa, la] = points[i - 1] as readonly [number, number];
    const [fb, lb] = points[i] as readonly [number, number];
    if (f <= fb) return la + ((lb - la) * (f - fa)) / (fb - fa);
  }
  return (points.at(-1) as readonly [number, number])[1];
}

/** Which rule masks are set in terms of the authorised bandwidth, and how each is built. */
const RULE_BUILDERS: Readonly<Record<string, { needsBandwidth: boolean; build: (b: number, p: number | null) => Mask }>> = {
  "cfr-90.210-b": { needsBandwidth: true, build: mask90210B },
  "cfr-90.210-c": { needsBandwidth: true, build: mask90210C },
  "cfr-90.210-d": { needsBandwidth: false, build: (_b, p) => mask90210D(p) },
  "cfr-90.210-e": { needsBandwidth: false, build: (_b, p) => mask90210E(p) },
  "cfr-90.210-g": { needsBandwidth: true, build: mask90210G },
  "cfr-90.210-h": { needsBandwidth: false, build: (_b, p) => mask90210H(p) },
  "cfr-90.210-i": { needsBandwidth: false, build: (_b, p) => mask90210I(p) },
  "cfr-80.211-f": { needsBandwidth: true, build: mask80211F },
  "cfr-73.317": { needsBandwidth: false, build: (_b, p) => mask73317(p) },
};

/**
 * The Mask a licence implies: its `mask` points (relative to its maskReference, default carrier)
 * or named rule (with authorisedBandwidthHz and transmitterPowerW), or null when it has no mask.
 * A rule fixes its own reference; a maskReference that differs is noted as not used. Throws
 * ParameterError when a rule needs authorisedBandwidthHz and it is absent.
 */
export function licenceMask(licence: Licence): Mask | null {
  const m = licence.mask;
  if (m === undefined) return null;
  if (typeof m !== "string") return pointMask(m, licence.maskReference ?? "carrier");
  const builder = RULE_BUILDERS[m];
  const info = RULE_INFO[m];
  if (builder === undefined || info === undefined) throw new ParameterError("mask", `"${m}" is not a rule mask; known: ${RULE_MASK_NAMES.join(", ")}`);
  const b = licence.authorisedBandwidthHz;
  if (builder.needsBandwidth && b === undefined) {
    throw new ParameterError("authorisedBandwidthHz", `mask ${m} (${info.source}) is set in terms of the authorised bandwidth: give authorisedBandwidthHz in the licence file`);
  }
  const mask = builder.build(b ?? Number.NaN, licence.transmitterPowerW ?? null);
  const r = licence.maskReference;
  if (r === undefined || r === mask.reference) return mask;
  const words = mask.reference === "peak" ? "the highest emission within the authorised bandwidth" : "the unmodulated carrier (the mean output power)";
  return { ...mask, notes: [...mask.notes, `maskReference "${r}" is not used: ${info.source} measures relative to ${words}`] };
}
