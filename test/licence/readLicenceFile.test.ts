import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { LicenceFileError } from "../../src/errors.js";
import { LICENCE_FILE_MAX_BYTES, readLicenceFile } from "../../src/licence/index.js";

const dir = mkdtempSync(join(tmpdir(), "iqaudit-licence-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function file(name: string, content: string | Buffer): string {
  const path = join(dir, name);
  writeFileSync(path, content);
  return path;
}

async function refusal(path: string): Promise<LicenceFileError> {
  const e: unknown = await readLicenceFile(path).then(() => null, (x: unknown) => x);
  expect(e).toBeInstanceOf(LicenceFileError);
  return e as LicenceFileError;
}

describe("readLicenceFile(path)", () => {
  it("reads and parses a UTF-8 licence file", async () => {
    expect(await readLicenceFile(file("ok.json", '{"maxDeviationHz": 2500}'))).toEqual({ maxDeviationHz: 2500 });
  });

  it("refuses, naming the path: no such file, a directory, bytes that are not UTF-8, a file too large", async () => {
    expect((await refusal(join(dir, "missing.json"))).message).toBe(`${join(dir, "missing.json")}: field (file): no such file`);
    expect((await refusal(dir)).message).toMatch(/is a directory/);
    expect((await refusal(file("latin1.json", Buffer.from([0x7b, 0x22, 0xe9, 0x22, 0x3a, 0x31, 0x7d])))).message).toMatch(/not UTF-8/);
    expect((await refusal(file("big.json", " ".repeat(LICENCE_FILE_MAX_BYTES + 1)))).message).toMatch(/bytes; a licence file is a small JSON object/);
  });

  it("passes parseLicence's refusals through with the path as the file", async () => {
    const path = file("bad.json", '{"maxDeviationHz": "5k"}');
    const e = await refusal(path);
    expect(e.file).toBe(path);
    expect(e.field).toBe("maxDeviationHz");
  });
});
