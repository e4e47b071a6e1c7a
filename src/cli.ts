#!/usr/bin/env node
/**
 * Command-line wiring only (commander): every command is a function in src/commands/ that the
 * tests call directly too. This file alone turns an IqauditError into exit code 2 and one line
 * on stderr, `iqaudit: <subject>: <problem>`; any other exception is a bug and keeps its stack.
 */
import { Command, CommanderError, Option } from "commander";
import { isIqauditError, UsageError } from "./errors.js";
import { fftImplementation } from "./dsp/index.js";
import { TOOL_VERSION } from "./version.js";
import { addCaptureOptions, captureArgs, type RawCaptureFlags } from "./cli/captureOptions.js";
import { parseCount, parseFftLength, parseQuantity } from "./cli/quantity.js";
import { clearProgressLine, createProgress, lazyProgress } from "./cli/progress.js";
import { oneLine } from "./cli/errorLine.js";
import { CAUTIONS } from "./cli/cautions.js";
import { optionDescription, usageSubject } from "./cli/helpFormat.js";
import { inspectCommand } from "./commands/inspect.js";
import { spectrogramCommand, SPECTROGRAM_DEFAULTS } from "./commands/spectrogram.js";
import { demoCommand } from "./commands/demo.js";
import { inspectText } from "./report/inspectText.js";
import { measureCommand } from "./commands/measure.js";
import { measureText } from "./report/measureText.js";
import { surveyCommand } from "./commands/survey.js";
import { surveyMarkdown } from "./report/index.js";
import { MEASURE_MODES, type MeasureMode } from "./analysis/measureEmission.js";
import type { ChannelRequest } from "./analysis/channelRequest.js";
import { X_DB_REFERENCES, type XDbReference } from "./measure/index.js";
import { parseOutPath, writeStdout } from "./cli/stdout.js";
import { removeTemporaries } from "./report/index.js";
import { checkCommand } from "./commands/check.js";
import { checkText } from "./report/checkText.js";
import { templateListText } from "./licence/index.js";
import { archiveAdd, archiveCompare, archiveExport, archiveHistory, archiveList, archiveShow, archiveVerify } from "./commands/archive.js";
import { archiveCompareText, archiveHistoryText, archiveListText, archiveShowText, archiveVerifyText } from "./report/archiveText.js";
import { defaultArchivePath } from "./archive/index.js";

/** Exit code of a command that ran: 1 when `check` found a term failed (interface.md). */
let ranExitCode = 0;

interface GlobalFlags {
  quiet?: boolean;
}

function warn(lines: readonly string[]): void {
  if (lines.length > 0) clearProgressLine();
  for (const line of lines) process.stderr.write(`${oneLine(`iqaudit: warning: ${line}`)}\n`);
}

/** One example a command, on the bundled samples (samples/README.md). */
const EXAMPLES = [
  "Examples",
  "  iqaudit demo -o iqaudit-demo",
  "  iqaudit inspect samples/quay-links.sigmf-meta",
  "  iqaudit spectrogram samples/ostrel-bay-survey_165.2MHz_1Msps.cu8 -o survey.png",
  "  iqaudit measure samples/ostrel-bay-survey_165.2MHz_1Msps.cu8 --channel 165.05M:12.5k --nominal 165.05M -o talkback",
  "  iqaudit check samples/launch-channel_164.975MHz.wav --center 164.975M --licence samples/launch-channel.licence.json -o launch-check",
  "  iqaudit survey samples/ostrel-bay-survey_165.2MHz_1Msps.cu8 -o survey",
  "  iqaudit archive add launch-check --tag launch && iqaudit archive list --tag launch",
].join("\n");

function program(): Command {
  const root = new Command("iqaudit")
    .description(
      "Measure radio emissions from IQ captures (raw cu8/ci8/ci16/cf32/cf64, WAV incl. RF64, SigMF): " +
        "what the file is and whether it is healthy (inspect), its picture (spectrogram), the measurement of one " +
        "emission (measure), a check of a transmitter against its licence (check), triage of every emission of a " +
        "wideband capture (survey), a local archive of the reports (archive), and the bundled sample scenario (demo).",
    )
    .configureHelp({ optionDescription })
    .version(TOOL_VERSION, "-V, --version", "print the version")
    .option("-q, --quiet", "no progress display on stderr (warnings are still shown)")
    .helpOption("-h, --help", "explain a command: iqaudit <command> --help")
    .addHelpText("after", `\n${EXAMPLES}\n\n${CAUTIONS}\n`);
  const quiet = (): boolean => (root.opts() as GlobalFlags).quiet === true;

  addCaptureOptions(
    root
      .command("inspect")
      .argument("<capture>", "capture file (.cu8 .cs8 .cs16 .cf32 .cf64 raw, .wav, .sigmf-meta or .sigmf-data)")
      .description("what the file is and whether it is healthy: format, rate, duration, centre, clipping, DC offset, IQ imbalance, noise floor, strongest line"),
  )
    .option("--json", "print the report as one JSON document on stdout (schema iqaudit/inspect/1)")
    .option("--fft <n>", "Welch segment length for the PSD, a power of two", "4096")
    .addHelpText("after", "\nFigures and methods: docs/methods.md.")
    .action(async (path: string, flags: RawCaptureFlags & { json?: boolean; fft: string }) => {
      const progress = createProgress(`inspect ${path}`, !quiet());
      const report = await inspectCommand(path, {
        capture: captureArgs(flags),
        pass1: { welchFftLength: parseFftLength("--fft", flags.fft), onProgress: progress.onProgress },
      });
      progress.done();
      warn(report.warnings);
      await writeStdout(flags.json === true ? `${JSON.stringify(report, null, 2)}\n` : inspectText(report));
    });

  addCaptureOptions(
    root
      .command("spectrogram")
      .argument("<capture>", "capture file")
      .description("write a spectrogram PNG: frequency across, time down, dBFS/Hz colour bar, axes and title"),
  )
    .requiredOption("-o, --out <file.png>", "the PNG to write (written to a temporary name, then renamed)")
    .option("--fft <n>", "FFT length of each frame, a power of two", String(SPECTROGRAM_DEFAULTS.fftLength))
    .option("--rows <n>", "number of time rows (default one per pixel row of the plot; fewer when the span holds fewer frames)")
    .option("--size <WxH>", "image size in pixels", `${SPECTROGRAM_DEFAULTS.widthPx}x${SPECTROGRAM_DEFAULTS.heightPx}`)
    .option("--db-range <min:max>", "colour scale in dBFS/Hz, e.g. -150:-90 (default: from the noise floor to the peak)")
    .addOption(new Option("--reduce <how>", "combine the frames of a row by their mean or their maximum").choices(["mean", "max"]).default("mean"))
    .option("--json", "print a JSON summary of what was written on stdout")
    .action(
      async (
        path: string,
        flags: RawCaptureFlags & { out: string; fft: string; rows?: string; size: string; dbRange?: string; reduce: "mean" | "max"; json?: boolean },
      ) => {
        const [widthPx, heightPx] = parseSize(flags.size);
        const progress = createProgress(`spectrogram ${path}`, !quiet());
        const summary = await spectrogramCommand(path, {
          capture: captureArgs(flags),
          outputPath: parseOutPath("--out", flags.out),
          fftLength: parseFftLength("--fft", flags.fft),
          rows: flags.rows === undefined ? undefined : parseCount("--rows", flags.rows),
          widthPx,
          heightPx,
          dbRange: flags.dbRange === undefined ? undefined : parseDbRange(flags.dbRange),
          reduce: flags.reduce,
          pass1: { onProgress: progress.onProgress },
        });
        progress.done();
        warn(summary.warnings);
        if (flags.json === true) await writeStdout(`${JSON.stringify(summary, null, 2)}\n`);
      },
    );

  addCaptureOptions(
    root
      .command("measure")
      .argument("<capture>", "capture file")
      .description(
        "measure one emission: carrier offset/frequency/error, occupied and x-dB bandwidth, channel power and SNR, " +
          "class (cw, am, fm, fsk, ook, psk, qam) and order, FM deviation and tones, AM depth, symbol rate, EVM/MER, " +
          "FSK shift, OOK duty cycle, emission designator; writes a report folder with --out",
      ),
  )
    .option("--channel <centre:width>", "measure the emission in this channel: its centre as an offset from the capture centre (12.5k:25k) or, with the capture's centre known, as an absolute frequency (164.85M:25k); default the emission nearest --nominal, else the strongest")
    .option("--nominal <Hz>", "assigned (nominal) carrier frequency, for the error in ppm; without --channel the emission nearest it is measured; needs --center")
    .option("--reference-ppm <u>", "uncertainty of the receiver's frequency reference, ppm (k = 2), added to the carrier's uncertainty; without it the report says it is not included")
    .option("--xdb <dB>", "level below the spectral peak for the x-dB bandwidth", "26")
    .addOption(new Option("--xdb-reference <trace>", "0 dB reference of the x-dB bandwidth: the maximum of the max-hold spectrum (peak-hold) or of the mean PSD (average)").choices(X_DB_REFERENCES).default("peak-hold"))
    .option("--audio-bw <Hz>", "audio low-pass before FM peak deviation and AM depth (clicks of noise are removed)", "3k")
    .addOption(new Option("--mode <class>", "take the emission as this class instead of classifying it").choices(MEASURE_MODES))
    .option("--order <n>", "order of a digital emission: 2, 4, 8 (psk), 16, 32, 64 (qam), 2 or 4 (fsk)")
    .option("--symbol-rate <Bd>", "symbol rate of a digital emission, e.g. 19.2k (default: found blind)")
    .option("--rolloff <alpha>", "RRC roll-off of a PSK/QAM emission (default: estimated from its occupied bandwidth)")
    .option("-o, --out <dir>", "write report.json, report.md and the figures (PNG) into this folder, published whole (an earlier report there is replaced)")
    .option("--json", "print the report as one JSON document on stdout (schema iqaudit/report/1)");
  archiveAddOptions(root.commands[root.commands.length - 1] as Command)
    .addHelpText(
      "after",
      "\nWithout --json a summary for a person is printed. Figures and methods: docs/methods.md.\n" +
        "Results are indicative: the licence and local regulation decide what applies; see iqaudit --help for cautions.",
    )
    .action(
      async (
        path: string,
        flags: RawCaptureFlags & {
          channel?: string; nominal?: string; referencePpm?: string; xdb: string; xdbReference: XDbReference; audioBw: string; mode?: MeasureMode; out?: string; json?: boolean;
          order?: string; symbolRate?: string; rolloff?: string;
        } & ArchiveAddFlags,
      ) => {
        checkArchiveAdd(flags);
        const progress = createProgress(`measure ${path}`, !quiet());
        const result = await measureCommand(path, {
          capture: captureArgs(flags),
          channelAsGiven: flags.channel === undefined ? undefined : parseChannel(flags.channel),
          nominalHz: flags.nominal === undefined ? undefined : parseQuantity("--nominal", flags.nominal, { unit: "Hz", min: 0 }),
          referencePpm: flags.referencePpm === undefined ? undefined : parseQuantity("--reference-ppm", flags.referencePpm, { unit: "none", min: 0 }),
          xDb: parseQuantity("--xdb", flags.xdb, { unit: "none", min: 0 }),
          xDbReference: flags.xdbReference,
          audioBandwidthHz: parseQuantity("--audio-bw", flags.audioBw, { unit: "Hz", min: 0 }),
          mode: flags.mode,
          order: flags.order === undefined ? undefined : parseCount("--order", flags.order, 2),
          symbolRateBd: flags.symbolRate === undefined ? undefined : parseQuantity("--symbol-rate", flags.symbolRate, { unit: "none", min: 0 }),
          rollOff: flags.rolloff === undefined ? undefined : parseQuantity("--rolloff", flags.rolloff, { unit: "none", min: 0 }),
          outDir: flags.out === undefined ? undefined : parseOutPath("--out", flags.out),
          pass1: { onProgress: progress.onProgress },
        });
        progress.done();
        warn(result.report.warnings);
        await archiveAfter(flags);
        await writeStdout(flags.json === true ? `${JSON.stringify(result.report, null, 2)}\n` : measureText(result.report, result.files));
      },
    );

  addCaptureOptions(
    root
      .command("survey")
      .argument("<capture>", "capture file")
      .description(
        "find every emission of a wideband capture blind, measure each on its own channel, and mark the " +
          "receiver's DC spike and IQ images as artefacts; writes survey.json, survey.md, survey.png and one " +
          "folder per emission with --out",
      ),
  )
    .option("--pfa <p>", "false-alarm probability per spectrogram cell of the detection threshold", "1e-6")
    .option("--min-bandwidth <Hz>", "drop emissions narrower than this (99 % bandwidth)", "0")
    .option("--min-duration <s>", "drop emissions on for less than this in all", "0")
    .option("--audio-bw <Hz>", "audio low-pass before FM peak deviation and AM depth", "3k")
    .option("--sigmf-annotations", "also write <capture>.survey.sigmf-meta beside the capture: its metadata with one annotation per emission (never the capture's own .sigmf-meta)")
    .option("-o, --out <dir>", "write survey.json, survey.md, survey.png and a folder per emission into this folder, published whole")
    .option("--json", "print the survey as one JSON document on stdout (schema iqaudit/survey/1)")
    .option("--threads <n>", "worker threads for the channel extraction and the analyses: 2 by default on a machine of two or more cores; 1 or 0 to use less memory (0: all in the main thread)");
  archiveAddOptions(root.commands[root.commands.length - 1] as Command)
    .addHelpText(
      "after",
      "\nThe detection threshold follows from --pfa and the chi-square law of averaged periodograms (docs/methods.md).",
    )
    .action(
      async (
        path: string,
        flags: RawCaptureFlags & { pfa: string; minBandwidth: string; minDuration: string; audioBw: string; sigmfAnnotations?: boolean; out?: string; json?: boolean; threads?: string } & ArchiveAddFlags,
      ) => {
        checkArchiveAdd(flags);
        const progress = createProgress(`survey ${path}`, !quiet());
        const threads = flags.threads === undefined ? undefined : parseQuantity("--threads", flags.threads, { unit: "none", min: 0, minInclusive: true });
        if (threads !== undefined && !(Number.isInteger(threads) && threads <= 8)) throw new UsageError("--threads", `${flags.threads} must be a whole number from 0 to 8`);
        const extraction = lazyProgress(() => { progress.done(); return createProgress(`survey ${path}: channels`, !quiet()); });
        const pfa = parseQuantity("--pfa", flags.pfa, { unit: "none", min: 0 });
        if (!(pfa > 0 && pfa < 1)) throw new UsageError("--pfa", `${flags.pfa} must lie between 0 and 1`);
        const result = await surveyCommand(path, {
          capture: captureArgs(flags),
          pfa,
          minBandwidthHz: parseQuantity("--min-bandwidth", flags.minBandwidth, { unit: "Hz", min: 0, minInclusive: true }),
          minDurationS: parseQuantity("--min-duration", flags.minDuration, { unit: "s", min: 0, minInclusive: true }),
          audioBandwidthHz: parseQuantity("--audio-bw", flags.audioBw, { unit: "Hz", min: 0 }),
          sigmfAnnotations: flags.sigmfAnnotations === true,
          outDir: flags.out === undefined ? undefined : parseOutPath("--out", flags.out),
          workers: threads,
          pass1: { onProgress: progress.onProgress },
          extractionProgress: extraction.onProgress,
        });
        progress.done();
        extraction.done();
        warn(result.report.warnings);
        await archiveAfter(flags);
        const written = result.files.length === 0 ? "" : `\nWritten: ${result.files.length} files under ${flags.out ?? "."}${result.files.some((f) => f.endsWith(".sigmf-meta")) ? ` and ${result.files.find((f) => f.endsWith(".sigmf-meta"))}` : ""}\n`;
        await writeStdout(flags.json === true ? `${JSON.stringify(result.report, null, 2)}\n` : `${surveyMarkdown(result.report)}${written}`);
      },
    );

  addCaptureOptions(
    root
      .command("check")
      .argument("[capture]", "capture file of the transmitter under test")
      .description(
        "check one emission against the terms of its licence: carrier frequency error against the tolerance, " +
          "peak deviation (over every sample, with when it happened), 99 % occupied bandwidth, emission designator, " +
          "spectral mask (max hold over the whole recording) and adjacent-channel power, each with its margin, " +
          "uncertainty (k = 2) and an uncertainty-aware decision; exit 0 when every check passes, 1 when any fails",
      ),
  )
    .option("--licence <file.json>", "the licence's terms as JSON (fields: docs/licence.md); over a template's, field by field")
    .option("--template <name>", "a licence template for a common channel class (see --list-templates)")
    .option("--assigned <Hz>", "assigned frequency, e.g. 164.975M (over the licence's and the template's)")
    .option("--list-templates", "list the licence templates with their values, sources and status, and exit")
    .option("--reference-ppm <u>", "uncertainty of the receiver's frequency reference, ppm (k = 2), carried into the frequency check; without it the report says it is not included")
    .option("-o, --out <dir>", "write check.json, check.md, mask.png and the measure report (report.json, report.md, figures) into this folder, published whole")
    .option("--json", "print the check as one JSON document on stdout (schema iqaudit/check/1)");
  archiveAddOptions(root.commands[root.commands.length - 1] as Command)
    .addHelpText(
      "after",
      "\nDecision rule: ILAC-G8:09/2019 §4.2.3 with the guard band w = U: pass, conditional pass (within U below the limit),\n" +
        "conditional fail (within U above it), fail. The exit code follows simple acceptance (touching the limit passes).\n" +
        "Licence file, templates and methods: docs/licence.md and docs/methods.md.\n\n" +
        "Examples\n  iqaudit check launch.wav --licence launch-licence.json -o launch-check\n" +
        "  iqaudit check ch.cf32 --rate 48k --center 165.1375M --template vhf-land-mobile-12k5 --assigned 165.1375M\n\n" +
        `${CAUTIONS}\n  - A check here is indicative only, not an accredited test: the licence and local regulation prevail.\n`,
    )
    .action(
      async (
        path: string | undefined,
        flags: RawCaptureFlags & { licence?: string; template?: string; assigned?: string; listTemplates?: boolean; referencePpm?: string; out?: string; json?: boolean } & ArchiveAddFlags,
      ) => {
        checkArchiveAdd(flags);
        if (flags.listTemplates === true) {
          await writeStdout(templateListText());
          return;
        }
        if (path === undefined) throw new UsageError("<capture>", "give the capture to check (or --list-templates)");
        const progress = createProgress(`check ${path}`, !quiet());
        const result = await checkCommand(path, {
          capture: captureArgs(flags),
          licencePath: flags.licence,
          template: flags.template,
          assignedHz: flags.assigned === undefined ? undefined : parseQuantity("--assigned", flags.assigned, { unit: "Hz", min: 0 }),
          referencePpm: flags.referencePpm === undefined ? undefined : parseQuantity("--reference-ppm", flags.referencePpm, { unit: "none", min: 0 }),
          outDir: flags.out === undefined ? undefined : parseOutPath("--out", flags.out),
          pass1: { onProgress: progress.onProgress },
        });
        progress.done();
        warn(result.report.warnings);
        await archiveAfter(flags);
        await writeStdout(flags.json === true ? `${JSON.stringify(result.report, null, 2)}\n` : checkText(result.report, result.files));
        if (result.report.verdict === "fail") ranExitCode = 1;
      },
    );

  addArchiveCommands(root);

  root
    .command("demo")
    .description("write the bundled sample scenario's captures (if missing) and run the tool on them")
    .option("-o, --out <dir>", "where to write the captures and results", "iqaudit-demo")
    .action(async (flags: { out: string }) => {
      const summary = await demoCommand({ outDir: parseOutPath("--out", flags.out), progress: (label) => createProgress(label, !quiet()) });
      warn(summary.warnings);
      await writeStdout(summary.text);
    });
  return root;
}

interface ArchiveFlags { archive?: string; json?: boolean }

interface ArchiveAddFlags { archiveAdd?: boolean; archive?: string; tag: string[]; note?: string }

/** --archive-add and its companions on a command that writes a report folder with -o. */
function archiveAddOptions(c: Command): Command {
  return archiveOption(c)
    .option("--archive-add", "store the report folder written with -o in the archive (iqaudit archive add)")
    .option("--tag <name>", "with --archive-add: a tag for the entry, e.g. a station name (repeatable)", collect, [])
    .option("--note <text>", "with --archive-add: a note kept with the entry");
}

/** Checked before the command runs: --archive-add needs the folder it stores. */
function checkArchiveAdd(flags: ArchiveAddFlags & { out?: string }): void {
  if (flags.archiveAdd === true && flags.out === undefined) throw new UsageError("--archive-add", "needs -o DIR: the archive stores the report folder written there");
}

/** After the folder is published: store it, and say so on stderr (stdout carries only the requested output). */
async function archiveAfter(flags: ArchiveAddFlags & { out?: string }): Promise<void> {
  if (flags.archiveAdd !== true || flags.out === undefined) return;
  const r = await archiveAdd([flags.out], { archivePath: flags.archive, tags: flags.tag, note: flags.note });
  for (const e of r.entries) process.stderr.write(`iqaudit: ${e.added ? "archived" : "already in the archive"}: entry ${e.id} in ${r.archive}\n`);
}

/** The repeatable --tag. */
function collect(value: string, previous: string[]): string[] {
  return [...previous, value];
}

function archiveOption(c: Command): Command {
  return c.option("--archive <path>", `the archive's database file (default: IQAUDIT_ARCHIVE, else ${defaultArchivePath()})`);
}

function parseId(option: string, text: string): number {
  const n = Number(text);
  if (!Number.isInteger(n) || n < 1) throw new UsageError(option, `'${text}' is not an entry id (a whole number from 1; iqaudit archive list)`);
  return n;
}

function addArchiveCommands(root: Command): void {
  const archive = root
    .command("archive")
    .description("a local archive of reports (one SQLite database and its stored files): add, list, show, export, compare, history, verify")
    .addHelpText("after", "\nEntries are stored whole or not at all; `verify` re-hashes every stored file. Storage and schema: docs/archive.md.");
  archiveOption(archive.command("add").argument("<report-dir...>", "report folders written with -o by measure, check or survey"))
    .description("store report folders (each whole, checked against the SHA-256 its manifest lists); one already stored is recognised and only gains the new tags")
    .option("--tag <name>", "a tag to find the entry by, e.g. a station or transmitter (repeatable)", collect, [])
    .option("--note <text>", "a note kept with the entry")
    .option("--captured-at <iso>", "when the capture was recorded (ISO 8601, UTC), where the capture file does not say (WAV, raw)")
    .option("--json", "print the added entries as JSON")
    .action(async (dirs: string[], flags: ArchiveFlags & { tag: string[]; note?: string; capturedAt?: string }) => {
      const r = await archiveAdd(dirs, { archivePath: flags.archive, tags: flags.tag, note: flags.note, capturedAt: flags.capturedAt });
      await writeStdout(flags.json === true ? `${JSON.stringify(r, null, 2)}\n` : r.entries.map((e) => `${e.added ? "added" : "already stored"}: entry ${e.id} (${e.kind}) from ${e.folder}\n`).join(""));
    });
  archiveOption(archive.command("list"))
    .description("the entries, oldest first, filtered by frequency, class, designator, tag, time, capture or check decision")
    .option("--from-hz <Hz>", "lowest frequency (absolute RF), e.g. 164.9M")
    .option("--to-hz <Hz>", "highest frequency (absolute RF)")
    .option("--class <class>", "modulation class: cw, am, fm, fsk, ook, psk, qam, noise, unknown")
    .option("--designator <code>", "emission designator, e.g. 16K0F3E")
    .option("--tag <name>", "entries with this tag")
    .option("--since <iso>", "entries recorded (else measured) at or after this time")
    .option("--until <iso>", "entries recorded (else measured) at or before this time")
    .option("--capture <sha256>", "entries of the capture with this SHA-256")
    .option("--decision <d>", "check entries with this decision: pass, conditional-pass, conditional-fail, fail")
    .option("--json", "print the entries as a JSON array")
    .action(async (flags: ArchiveFlags & { fromHz?: string; toHz?: string; class?: string; designator?: string; tag?: string; since?: string; until?: string; capture?: string; decision?: string }) => {
      const time = (option: string, t: string | undefined): string | undefined => {
        if (t === undefined) return undefined;
        if (Number.isNaN(Date.parse(t))) throw new UsageError(option, `'${t}' is not an ISO 8601 time, e.g. 2024-09-17 or 2024-09-17T07:05:00Z`);
        return new Date(t).toISOString();
      };
      const entries = await archiveList({
        minFrequencyHz: flags.fromHz === undefined ? undefined : parseQuantity("--from-hz", flags.fromHz, { unit: "Hz", min: 0, minInclusive: true }),
        maxFrequencyHz: flags.toHz === undefined ? undefined : parseQuantity("--to-hz", flags.toHz, { unit: "Hz", min: 0, minInclusive: true }),
        modulationClass: flags.class, designator: flags.designator, tag: flags.tag,
        from: time("--since", flags.since), to: time("--until", flags.until), captureSha256: flags.capture, checkDecision: flags.decision,
      }, { archivePath: flags.archive });
      await writeStdout(flags.json === true ? `${JSON.stringify(entries, null, 2)}\n` : archiveListText(entries));
    });
  archiveOption(archive.command("show").argument("<id>", "entry id"))
    .description("one entry: its capture, tags, files with their SHA-256 and every figure with its uncertainty")
    .option("--json", "print the entry as JSON")
    .action(async (id: string, flags: ArchiveFlags) => {
      const d = await archiveShow(parseId("<id>", id), { archivePath: flags.archive });
      await writeStdout(flags.json === true ? `${JSON.stringify(d, null, 2)}\n` : archiveShowText(d));
    });
  archiveOption(archive.command("export").argument("<id>", "entry id"))
    .description("write an entry's report and figures, byte-identical to what was added, into a folder (published whole)")
    .requiredOption("-o, --out <dir>", "the folder to write")
    .action(async (id: string, flags: ArchiveFlags & { out: string }) => {
      const files = await archiveExport(parseId("<id>", id), parseOutPath("--out", flags.out), { archivePath: flags.archive });
      await writeStdout(`exported ${files.length} files into ${flags.out}\n`);
    });
  archiveOption(archive.command("compare").argument("<first>", "entry id").argument("<second>", "entry id"))
    .description("each figure two entries share, side by side, the change, and whether it exceeds the combined expanded uncertainty √(U1² + U2²)")
    .option("--json", "print the comparison as JSON")
    .action(async (a: string, b: string, flags: ArchiveFlags) => {
      const c = await archiveCompare(parseId("<first>", a), parseId("<second>", b), { archivePath: flags.archive });
      await writeStdout(flags.json === true ? `${JSON.stringify(c, null, 2)}\n` : archiveCompareText(c));
    });
  archiveOption(archive.command("history"))
    .description("one numeric report field over time for a tag, as a table and with -o a PNG with the uncertainty bars and the limit line")
    .requiredOption("--tag <name>", "the entries of this tag")
    .requiredOption("--field <path>", "a numeric report field, e.g. carrier.errorPpm, fm.peakDeviationHz, bandwidth.occupiedHz")
    .option("--limit <value>", "draw this limit (default: the limit of the tag's latest check of the field)")
    .option("-o, --out <file.png>", "write the figure")
    .option("--json", "print the history as JSON")
    .action(async (flags: ArchiveFlags & { tag: string; field: string; limit?: string; out?: string }) => {
      const h = await archiveHistory({
        archivePath: flags.archive, tag: flags.tag, field: flags.field,
        limit: flags.limit === undefined ? undefined : parseQuantity("--limit", flags.limit, { unit: "none" }),
        outPath: flags.out === undefined ? undefined : parseOutPath("--out", flags.out),
      });
      await writeStdout(flags.json === true ? `${JSON.stringify(h, null, 2)}\n` : archiveHistoryText(h));
    });
  archiveOption(archive.command("verify"))
    .description("re-hash every stored file and check the database's integrity; exit 1 when anything is missing or altered")
    .option("--json", "print the result as JSON")
    .action(async (flags: ArchiveFlags) => {
      const v = await archiveVerify({ archivePath: flags.archive });
      await writeStdout(flags.json === true ? `${JSON.stringify(v, null, 2)}\n` : archiveVerifyText(v));
      if (v.problems.length > 0) ranExitCode = 1;
    });
}

function parseChannel(text: string): ChannelRequest {
  const parts = text.split(":");
  if (parts.length !== 2) throw new UsageError("--channel", `'${text}' is not CENTRE:WIDTH in Hz, e.g. 12.5k:25k (offset) or 164.85M:25k (absolute)`);
  return {
    centreHz: parseQuantity("--channel", parts[0] as string, { unit: "Hz" }),
    widthHz: parseQuantity("--channel", parts[1] as string, { unit: "Hz", min: 0 }),
  };
}

function parseSize(text: string): [number, number] {
  const m = /^(\d+)x(\d+)$/i.exec(text.trim());
  if (m === null) throw new UsageError("--size", `'${text}' is not WIDTHxHEIGHT in pixels, e.g. 1200x800`);
  const w = Number(m[1]);
  const h = Number(m[2]);
  if (w < 480 || h < 320 || w > 10000 || h > 10000) throw new UsageError("--size", `${text} must be between 480x320 and 10000x10000`);
  return [w, h];
}

function parseDbRange(text: string): { minDb: number; maxDb: number } {
  const parts = text.split(":");
  if (parts.length !== 2) throw new UsageError("--db-range", `'${text}' is not MIN:MAX in dB, e.g. -150:-90`);
  const minDb = parseQuantity("--db-range", parts[0] as string, { unit: "none" });
  const maxDb = parseQuantity("--db-range", parts[1] as string, { unit: "none" });
  if (!(maxDb > minDb)) throw new UsageError("--db-range", `${text}: the maximum must be above the minimum`);
  return { minDb, maxDb };
}

/** Commander's own messages ("error: unknown option '--x'") as one contract line. */
function usageLine(e: CommanderError): string {
  const text = e.message.replace(/^error:\s*/i, "").split("\n")[0] as string;
  const subject = usageSubject(text);
  return `iqaudit: ${subject}: ${text} (see iqaudit --help)`;
}

function systemErrorLine(e: unknown): string | null {
  if (typeof e === "object" && e !== null && "code" in e && "path" in e && typeof (e as { path: unknown }).path === "string") {
    const { code, path } = e as { code: string; path: string };
    const reason: Record<string, string> = {
      ENOENT: "no such file or directory",
      EACCES: "permission denied",
      EISDIR: "is a directory",
      ENOTDIR: "a part of the path is not a directory",
      ENOSPC: "no space left on the device",
      EROFS: "read-only file system",
    };
    return `iqaudit: ${path}: ${reason[code] ?? code}`;
  }
  return null;
}

export async function main(argv: readonly string[]): Promise<number> {
  const cli = program();
  const quietly = (c: Command): void => {
    c.exitOverride();
    // A bare `iqaudit` (or `iqaudit archive`) asks what the tool does: commander prints the help
    // through writeErr as an error ("commander.help"); it goes to stdout and the exit is 0. Errors
    // themselves go through outputError, silenced here and printed by main as one line.
    c.configureOutput({ outputError: () => undefined, writeErr: (text) => process.stdout.write(text) });
    for (const sub of c.commands) quietly(sub);
  };
  quietly(cli);
  const fftProblem = fftImplementation().problem;
  if (fftProblem !== null) {
    process.stderr.write(`${oneLine(`iqaudit: ${fftProblem}`)}\n`);
    return 2;
  }
  try {
    ranExitCode = 0;
    await cli.parseAsync(argv as string[], { from: "node" });
    return ranExitCode;
  } catch (e) {
    clearProgressLine();
    if (e instanceof CommanderError) {
      if (e.exitCode === 0 || e.code === "commander.help") return 0; // --help, --version, a command left out
      process.stderr.write(`${oneLine(usageLine(e))}\n`);
      return 2;
    }
    if (isIqauditError(e)) {
      process.stderr.write(`${oneLine(`iqaudit: ${e.message}`)}\n`);
      return 2;
    }
    const line = systemErrorLine(e);
    if (line !== null) {
      process.stderr.write(`${oneLine(line)}\n`);
      return 2;
    }
    process.stderr.write(`iqaudit: internal error (a bug; please report it with this trace):\n${e instanceof Error ? (e.stack ?? e.message) : String(e)}\n`);
    return 70;
  }
}

// A reader that stops early (`iqaudit inspect x | head`) is not an error of ours; any other
// failure of stdout reaches main through writeStdout's callback.
process.stdout.on("error", (e: NodeJS.ErrnoException) => {
  if (e.code === "EPIPE") process.exit(0);
});

// Interrupted (Ctrl-C, kill): remove this run's temporary files and folders, then end by the
// same signal, as a shell expects.
for (const signal of ["SIGINT", "SIGTERM", "SIGHUP"] as const) {
  process.once(signal, () => {
    removeTemporaries();
    process.kill(process.pid, signal);
  });
}

main(process.argv).then(
  (code) => {
    process.exitCode = code;
  },
  (e: unknown) => {
    process.stderr.write(`${String(e)}\n`);
    process.exitCode = 70;
  },
);
