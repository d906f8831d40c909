import { readFileSync } from "node:fs";
import path from "node:path";

let version: string | undefined;

/** The app version from package.json, read once. */
export function appVersion(): string {
  version ??= (JSON.parse(readFileSync(path.resolve("package.json"), "utf8")) as { version: string }).version;
  return version;
}
