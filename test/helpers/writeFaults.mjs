// Loaded with `node --import` into the command line under test (runCli's `faults` option): every
// file write (FileHandle.writeFile, which all of iqaudit's output goes through) is counted against
// a disk of IQAUDIT_TEST_DISK_BYTES bytes; the write that does not fit writes what fits and then
// fails as a full disk does, with IQAUDIT_TEST_DISK_ERROR (ENOSPC by default; EDQUOT, EIO).
// IQAUDIT_TEST_WRITE_DELAY_MS makes each write wait first, so that a test can interrupt a run
// while its temporary files exist.
import { open } from "node:fs/promises";
import { constants } from "node:os";

const budget = Number(process.env.IQAUDIT_TEST_DISK_BYTES ?? Number.POSITIVE_INFINITY);
const code = process.env.IQAUDIT_TEST_DISK_ERROR ?? "ENOSPC";
const delayMs = Number(process.env.IQAUDIT_TEST_WRITE_DELAY_MS ?? 0);
const MESSAGES = { ENOSPC: "no space left on device", EDQUOT: "disk quota exceeded", EIO: "i/o error" };

const probe = await open(process.execPath, "r");
const proto = Object.getPrototypeOf(probe);
await probe.close();
const original = proto.writeFile;
let used = 0;

proto.writeFile = async function writeFile(data, options) {
  if (delayMs > 0) await new Promise((resolve) => setTimeout(resolve, delayMs));
  const bytes = typeof data === "string" ? Buffer.from(data, "utf8") : Buffer.from(data.buffer, data.byteOffset, data.byteLength);
  if (used + bytes.length <= budget) {
    used += bytes.length;
    return original.call(this, bytes, options);
  }
  const room = Math.max(0, budget - used);
  used = budget;
  await original.call(this, bytes.subarray(0, room));
  const e = new Error(`${code}: ${MESSAGES[code] ?? code}, write`);
  throw Object.assign(e, { code, errno: -(constants.errno[code] ?? 5), syscall: "write" });
};
