/**
 * Where the archive lives: `--archive PATH`, else `IQAUDIT_ARCHIVE`, else the user's data
 * directory: `$XDG_DATA_HOME/iqaudit/archive.sqlite` (XDG Base Directory specification), else
 * `~/.local/share/iqaudit/` on Linux and the BSDs, `~/Library/Application Support/iqaudit/` on
 * macOS, `%LOCALAPPDATA%\iqaudit\` on Windows. The stored files sit beside the database in
 * `<name>.objects/`.
 */
import { homedir, platform } from "node:os";
import { join } from "node:path";

export const ARCHIVE_FILE_NAME = "archive.sqlite";

export function defaultArchivePath(env: NodeJS.ProcessEnv = process.env, os: NodeJS.Platform = platform(), home: string = homedir()): string {
  const given = env["IQAUDIT_ARCHIVE"];
  if (given !== undefined && given !== "") return given;
  return join(dataDirectory(env, os, home), "iqaudit", ARCHIVE_FILE_NAME);
}

function dataDirectory(env: NodeJS.ProcessEnv, os: NodeJS.Platform, home: string): string {
  if (os === "win32") return env["LOCALAPPDATA"] ?? join(home, "AppData", "Local");
  if (os === "darwin") return join(home, "Library", "Application Support");
  const xdg = env["XDG_DATA_HOME"];
  return xdg !== undefined && xdg.startsWith("/") ? xdg : join(home, ".local", "share");
}

/** The folder of content-addressed files beside a database file. */
export function objectsDirectory(databasePath: string): string {
  return `${databasePath}.objects`;
}
