// The command line as a person first meets it (issue "Everyday use"): one output option, -o/--out,
// on every command that writes (interface.md, "Output": "the one output option of every command");
// a missing required one named by its long name in the one error line (interface.md, "Exit
// codes": `iqaudit: <option>: <problem>`); a bare `iqaudit` that explains itself (common
// practice: a command-line tool run without arguments prints its usage); defaults shown as a
// person types them; every command named in the top-level help.
import { describe, expect, it } from "vitest";
import { expectOneErrorLine, runCli } from "../helpers/runCli.js";

const WRITERS: readonly (readonly string[])[] = [
  ["spectrogram"], ["measure"], ["survey"], ["check"], ["demo"], ["archive", "export"], ["archive", "history"],
];

/** The option lines of a command's help (commander's "Options:" block). */
function optionLines(help: string): string[] {
  const block = help.split("\nOptions:\n")[1] ?? "";
  return block.split("\n\n")[0]?.split("\n") ?? [];
}

describe("-o, --out on every command that writes", () => {
  for (const command of WRITERS) {
    it(`${command.join(" ")} --help shows -o, --out`, () => {
      const r = runCli([...command, "--help"]);
      expect(r.status, r.stderr).toBe(0);
      // interface.md, "Output": -o, --out is the one output option of every command.
      expect(optionLines(r.stdout).some((l) => /^ {2}-o, --out <[^>]+>/.test(l)), r.stdout).toBe(true);
      expect(r.stdout).not.toMatch(/--output\b/);
    });
  }

  it("spectrogram without -o gives the one line naming --out (interface.md: iqaudit: <option>: <problem>)", () => {
    const line = expectOneErrorLine(runCli(["spectrogram", "samples/quay-links.sigmf-meta"]));
    expect(line).toMatch(/^iqaudit: --out: /);
  });

  it("archive export without -o gives the one line naming --out", () => {
    const line = expectOneErrorLine(runCli(["archive", "export", "1"]));
    expect(line).toMatch(/^iqaudit: --out: /);
  });

  it("a missing option argument and an unknown option are named by the option's long name", () => {
    expect(expectOneErrorLine(runCli(["measure", "samples/quay-links.sigmf-meta", "-o"]))).toMatch(/^iqaudit: --out: /);
    expect(expectOneErrorLine(runCli(["measure", "samples/quay-links.sigmf-meta", "--mode", "xyz"]))).toMatch(/^iqaudit: --mode: /);
    expect(expectOneErrorLine(runCli(["inspect", "samples/quay-links.sigmf-meta", "--no-such"]))).toMatch(/^iqaudit: --no-such: /);
  });
});

describe("a bare iqaudit", () => {
  const r = runCli([]);

  it("prints the help on stdout and exits 0, with nothing on stderr (common practice)", () => {
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toBe("");
    expect(r.stdout).toMatch(/^Usage: iqaudit /);
    expect(r.stdout).not.toContain("(outputHelp)");
  });

  it("is the same text as iqaudit --help, also with only the global -q", () => {
    expect(r.stdout).toBe(runCli(["--help"]).stdout);
    const q = runCli(["-q"]);
    expect(q.status, q.stderr).toBe(0);
    expect(q.stdout).toBe(r.stdout);
  });

  it("likewise a bare iqaudit archive prints the archive's help on stdout and exits 0", () => {
    const a = runCli(["archive"]);
    expect(a.status, a.stderr).toBe(0);
    expect(a.stderr).toBe("");
    expect(a.stdout).toBe(runCli(["archive", "--help"]).stdout);
  });
});

describe("the top-level help", () => {
  const help = runCli(["--help"]).stdout;
  // The commands of interface.md, "Commands".
  const COMMANDS = ["inspect", "spectrogram", "measure", "check", "survey", "archive", "demo"];
  const [description = "", rest = ""] = help.split("\nOptions:\n");
  const examples = help.split("\nExamples\n")[1]?.split("\n\n")[0] ?? "";

  it("names every command in its description and in its examples", () => {
    for (const c of COMMANDS) {
      expect(description, c).toMatch(new RegExp(`\\(${c}\\)`));
      expect(examples, c).toMatch(new RegExp(`^ {2}iqaudit ${c} `, "m"));
    }
    expect(rest).toMatch(/Cautions/);
  });

  it("does not promise a command that exists already as future work", () => {
    expect(help).not.toMatch(/later version/);
  });
});

describe("defaults in --help", () => {
  it("are shown as typed, without quotes: (default: 3k), (default: 26), (choices: mean, max)", () => {
    const measure = runCli(["measure", "--help"]).stdout.replace(/\s+/g, " ");
    // The values below are those of docs/cli.md and the README (--audio-bw 3k, --xdb 26).
    expect(measure).toContain("(default: 3k)");
    expect(measure).toContain("(default: 26)");
    const spectrogram = runCli(["spectrogram", "--help"]).stdout.replace(/\s+/g, " ");
    expect(spectrogram).toContain("(choices: mean, max, default: mean)");
    for (const c of [["inspect"], ["spectrogram"], ["measure"], ["survey"], ["check"], ["demo"], ["archive", "add"]]) {
      const text = runCli([...c, "--help"]).stdout;
      expect(text, c.join(" ")).not.toMatch(/\(default: "/);
      expect(text, c.join(" ")).not.toMatch(/choices: "/);
      expect(text, c.join(" ")).not.toContain("(default: [])");
    }
  });
});

describe("help text after the options", () => {
  it("points to the cautions once, not in every command's help", () => {
    const pointer = /see iqaudit --help for cautions/;
    const withPointer = ["inspect", "spectrogram", "measure", "survey", "check", "demo"].filter((c) => pointer.test(runCli([c, "--help"]).stdout));
    expect(withPointer.length).toBeLessThanOrEqual(1);
  });
});
