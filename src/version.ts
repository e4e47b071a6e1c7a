/** The tool's name and version, read from package.json so that reports say which build made them. */
import { createRequire } from "node:module";

const pkg = createRequire(import.meta.url)("../package.json") as { name: string; version: string };

export const TOOL_NAME: string = pkg.name;
export const TOOL_VERSION: string = pkg.version;
