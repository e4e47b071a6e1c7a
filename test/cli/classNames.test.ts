// Class names for a person in every text output (issue "Everyday use"): the measure summary, the
// survey table, the check summary and the demo's SUMMARY, with the names of the trade (QPSK,
// 2FSK, FM, AM, CW: common practice), while the JSON keeps the contract's class and order
// (interface.md: modulation.class "psk", modulation.order 4). The expected classes are the
// transmitters of samples/README.md.
import { describe, expect, it } from "vitest";
import { runCli } from "../helpers/runCli.js";

describe("measure text", () => {
  it("names the quay link QPSK (samples/README.md: QPSK, 19 200 Bd) and the JSON keeps psk, 4", () => {
    const text = runCli(["-q", "measure", "samples/quay-links.sigmf-meta"]);
    expect(text.status, text.stderr).toBe(0);
    expect(text.stdout).toMatch(/^ {2}class +QPSK, confidence/m);
    const json = runCli(["-q", "measure", "samples/quay-links.sigmf-meta", "--json"]);
    const r = JSON.parse(json.stdout) as { modulation: { class: string; order: number } };
    expect(r.modulation).toMatchObject({ class: "psk", order: 4 });
  });
});

describe("survey table", () => {
  it("names the six transmitters of the site survey 2FSK, FM, AM, FM, QPSK, CW in frequency order (samples/README.md)", () => {
    const r = runCli(["-q", "survey", "samples/ostrel-bay-survey_165.2MHz_1Msps.cu8"]);
    expect(r.status, r.stderr).toBe(0);
    const classes = r.stdout.split("\n").filter((l) => /^\| \d+ \|/.test(l)).map((l) => l.split("|")[8]?.trim());
    // tidegauge 164.85 (2-FSK), launch 164.975 (FM), talkback 165.05 (AM), pilot 165.325 (FM),
    // quaylink 165.4 (QPSK), beacon 165.5 (CW).
    expect(classes).toEqual(["2FSK", "FM", "AM", "FM", "QPSK", "CW"]);
  });
});

describe("check text", () => {
  it("names the launch channel's emission FM (samples/README.md: FM, 16K0F3E licence)", () => {
    const r = runCli(["-q", "check", "samples/launch-channel_164.975MHz.wav", "--center", "164.975M", "--licence", "samples/launch-channel.licence.json"]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/^ {2}emission measured: FM, \d+K\dF3E$/m);
  });
});
