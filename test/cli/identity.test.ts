// What identifies a capture (issue "Everyday use"): for SigMF, the SHA-256 of the .sigmf-meta
// beside that of the data file (the metadata sets the rate and the centre, so it is part of what
// was measured), null for other containers; in `spectrogram --json` the hash named as the
// capture's, not the PNG's; and `inspect` listing a recording's description and annotations.
// Hashes are recomputed with node:crypto (FIPS 180-4 SHA-256, the reference); the annotation
// values are read from samples/quay-links.sigmf-meta with JSON.parse, field names of the SigMF
// specification v1.2 (core:label, core:freq_lower_edge, core:sample_start, …).
import { createHash } from "node:crypto";
import { mkdtempSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { runCli } from "../helpers/runCli.js";

const META = "samples/quay-links.sigmf-meta";
const DATA = "samples/quay-links.sigmf-data";
const WAV = "samples/launch-channel_164.975MHz.wav";
const sha256 = (path: string): string => createHash("sha256").update(readFileSync(path)).digest("hex");

interface Capture { sha256: string; metadataSha256: string | null }

function json<T>(args: readonly string[]): T {
  const r = runCli(["-q", ...args]);
  expect(r.status, r.stderr).toBe(0);
  return JSON.parse(r.stdout) as T;
}

describe("capture.metadataSha256", () => {
  it("inspect --json of a SigMF recording: the .sigmf-meta's SHA-256 beside the .sigmf-data's", () => {
    const c = json<{ capture: Capture }>(["inspect", META, "--json"]).capture;
    expect(c.metadataSha256).toBe(sha256(META));
    expect(c.sha256).toBe(sha256(DATA));
  });

  it("measure --json carries it too, whether the .sigmf-meta or the .sigmf-data is named", () => {
    expect(json<{ capture: Capture }>(["measure", META, "--json"]).capture.metadataSha256).toBe(sha256(META));
    expect(json<{ capture: Capture }>(["inspect", DATA, "--json"]).capture.metadataSha256).toBe(sha256(META));
  });

  it("is null for a WAV capture (no metadata file)", () => {
    expect(json<{ capture: Capture }>(["inspect", WAV, "--json"]).capture.metadataSha256).toBeNull();
  });
});

describe("spectrogram --json", () => {
  it("names the capture's hash captureSha256 (and its metadata's), distinct from the PNG's", () => {
    const png = join(mkdtempSync(join(tmpdir(), "iqaudit-id-")), "quay.png");
    const s = json<Record<string, unknown>>(["spectrogram", META, "-o", png, "--json"]);
    expect(s["captureSha256"]).toBe(sha256(DATA));
    expect(s["captureMetadataSha256"]).toBe(sha256(META));
    expect(s).not.toHaveProperty("sha256");
    expect(s["captureSha256"]).not.toBe(sha256(png));
  });
});

describe("inspect of a SigMF recording", () => {
  const file = JSON.parse(readFileSync(META, "utf8")) as {
    global: Record<string, string | number>;
    annotations: Record<string, string | number>[];
  };
  const rate = file.global["core:sample_rate"] as number;

  it("lists the description and every annotation in its JSON: label, RF edges, time span", () => {
    const s = json<{ sigmf: { description: string; annotations: Record<string, unknown>[] } }>(["inspect", META, "--json"]).sigmf;
    expect(s.description).toBe(file.global["core:description"]);
    expect(s.annotations).toHaveLength(file.annotations.length);
    file.annotations.forEach((a, k) => {
      expect(s.annotations[k]).toEqual({
        label: a["core:label"],
        comment: a["core:comment"],
        lowerFrequencyHz: a["core:freq_lower_edge"],
        upperFrequencyHz: a["core:freq_upper_edge"],
        // SigMF: sample indices over core:sample_rate give seconds from the first sample.
        startS: (a["core:sample_start"] as number) / rate,
        durationS: (a["core:sample_count"] as number) / rate,
      });
    });
  });

  it("lists them in its text: each label with its edges in MHz and its time span", () => {
    const r = runCli(["-q", "inspect", META]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toContain(`description: ${String(file.global["core:description"])}`);
    for (const a of file.annotations) {
      // MHz to the hertz, digits grouped in threes after the point (SI Brochure §5.4.4, as formatHz prints).
      const mhz = (hz: number): string => `${(hz / 1e6).toFixed(6).replace(/\.(\d{3})(\d{3})$/, ".$1 $2")} MHz`;
      const endS = ((a["core:sample_start"] as number) + (a["core:sample_count"] as number)) / rate;
      expect(r.stdout).toContain(`${String(a["core:label"])}: ${mhz(a["core:freq_lower_edge"] as number)} – ${mhz(a["core:freq_upper_edge"] as number)}, 0 s – ${endS.toFixed(3)} s`);
    }
  });

  it("has no SigMF section for a WAV capture (null in the JSON)", () => {
    expect(json<{ sigmf: unknown }>(["inspect", WAV, "--json"]).sigmf).toBeNull();
  });
});
