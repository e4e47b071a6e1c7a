/**
 * The one error family of iqaudit. Every expected failure (bad input, bad usage) is an
 * IqauditError with a literal `code`; `cli.ts` alone turns it into exit code 2 and one line on
 * stderr, `iqaudit: <subject>: <problem>`. Any other exception is a bug and keeps its stack.
 */
export type IqauditErrorCode =
  | "capture_format" // a capture file that cannot be read as claimed
  | "usage" // a bad option or option value
  | "parameter" // a parameter outside its bound (library use)
  | "licence_file" // a licence file that cannot be used
  | "archive" // an archive that cannot be opened or used, or an entry that is not there
  | "output"; // an output file, folder or stdout that cannot be written

export class IqauditError extends Error {
  readonly code: IqauditErrorCode;
  /** What the message is about: a file path or an option name. */
  readonly subject: string;
  constructor(code: IqauditErrorCode, subject: string, problem: string) {
    super(`${subject}: ${problem}`);
    this.name = "IqauditError";
    this.code = code;
    this.subject = subject;
  }
}

/** A capture (or its metadata) that cannot be read: names the file and, where known, the byte offset. */
export class CaptureFormatError extends IqauditError {
  readonly byteOffset: number | null;
  constructor(file: string, problem: string, byteOffset: number | null = null) {
    super("capture_format", file, problem);
    this.name = "CaptureFormatError";
    this.byteOffset = byteOffset;
  }
}

/** A command-line option with a value that cannot be used. `option` is spelled as typed, e.g. "--rate". */
export class UsageError extends IqauditError {
  readonly option: string;
  constructor(option: string, problem: string) {
    super("usage", option, problem);
    this.name = "UsageError";
    this.option = option;
  }
}

/** A library parameter outside its bound, e.g. "segmentLength 4096 exceeds the 1200 samples in the selection". */
export class ParameterError extends IqauditError {
  constructor(parameter: string, problem: string) {
    super("parameter", parameter, problem);
    this.name = "ParameterError";
  }
}

/**
 * A licence file (or a bundled licence template) that cannot be used: names the file, the field
 * ("(file)" when the file is not JSON at all) and the rule it breaks, in one line:
 * `licence.json: field maxDeviationHz: must be a number > 0 (Hz), not "5k"`.
 */
export class LicenceFileError extends IqauditError {
  readonly file: string;
  readonly field: string;
  constructor(file: string, field: string, rule: string) {
    super("licence_file", file, `field ${field}: ${rule}`);
    this.name = "LicenceFileError";
    this.file = file;
    this.field = field;
  }
}

/**
 * An output that cannot be written (a full disk, a folder that is not ours to replace, stdout
 * closed on a full device). `target` is the path the user gave (or "stdout"), never a temporary name.
 */
export class OutputError extends IqauditError {
  readonly target: string;
  constructor(target: string, problem: string) {
    super("output", target, problem);
    this.name = "OutputError";
    this.target = target;
  }
}

/** An archive (its database or stored files) that cannot be used, or a request it cannot answer. `subject` is the archive's path or the entry asked for. */
export class ArchiveError extends IqauditError {
  constructor(subject: string, problem: string) {
    super("archive", subject, problem);
    this.name = "ArchiveError";
  }
}

export function isIqauditError(e: unknown): e is IqauditError {
  return e instanceof IqauditError;
}
