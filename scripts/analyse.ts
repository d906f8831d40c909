// `npm run analyse -- [--json] [--key D] [--target "I IV V I"] FILE...`
// Without --json: a readable table per file. With --json and one file: exactly one JSON
// document on stdout (use `npm run -s` to keep npm's banner out); with several files, one JSON
// array. Bad input: one line on stderr, exit code 1, no stack trace.
import { readFileSync } from "node:fs";
import { parseArgs } from "node:util";
import { analyseMidi, AnalysisError, ProgressionError, type TakeAnalysis } from "../app/analysis/index";

type Args = { json: boolean; key?: string; target?: string; files: string[] };

const USAGE = 'usage: npm run analyse -- [--json] [--key D] [--target "I IV V I"] FILE...';

function readArgs(argv: string[]): Args {
  let parsed;
  try {
    parsed = parseArgs({
      args: argv,
      allowPositionals: true,
      options: {
        json: { type: "boolean", default: false },
        key: { type: "string" },
        target: { type: "string" },
        help: { type: "boolean", short: "h", default: false },
      },
    });
  } catch (e) {
    // Unknown options and options without their value: node's own message, on one line.
    throw new UsageError(`${(e as Error).message.split("\n")[0]}\n${USAGE}`);
  }
  const { values, positionals } = parsed;
  if (values.help || positionals.length === 0) throw new UsageError(USAGE);
  return { json: values.json, key: values.key, target: values.target, files: positionals };
}

class UsageError extends Error {}

const pad = (s: unknown, n: number) => String(s ?? "–").padEnd(n);
const padL = (s: unknown, n: number) => String(s ?? "–").padStart(n);

export function formatTable(file: string, a: TakeAnalysis): string {
  const s = a.summary;
  const lines: string[] = [];
  lines.push(
    `${file}  key ${s.key} (${s.keySource})  ${s.chordCount} chords, ${s.melodyNoteCount} melody notes, ${s.durationSec.toFixed(1)} s`,
  );
  lines.push(
    `${pad("#", 4)}${pad("time", 8)}${pad("symbol", 10)}${pad("roman", 8)}${pad("notes", 26)}${pad("inv", 5)}${pad("voicing", 8)}` +
      `${padL("motion", 7)}${padL("best", 6)}  flags / techniques`,
  );
  a.chords.forEach((c, i) => {
    const change = i > 0 ? a.changes[i - 1] : null;
    const marks = [...c.flags, ...(change?.flags ?? []), ...c.techniques.map((t) => `+${t}`)].join(" ");
    lines.push(
      `${pad(i + 1, 4)}${pad(c.startSec.toFixed(2), 8)}${pad(c.symbol, 10)}${pad(c.roman, 8)}${pad(c.noteNames.join(" "), 26)}` +
        `${pad(c.inversion, 5)}${pad(c.voicing, 8)}${padL(change ? change.motion : "", 7)}${padL(change ? change.bestMotion : "", 6)}  ${marks}`,
    );
    const hint = change?.suggestions[0];
    if (hint && change && change.motion !== null && hint.motion < change.motion) {
      lines.push(`${" ".repeat(12)}smoother: ${hint.noteNames.join(" ")} (${hint.motion} semitones)`);
    }
  });
  const flagList = Object.entries(s.flags)
    .filter(([, n]) => n > 0)
    .map(([f, n]) => `${f} ×${n}`);
  const techList = Object.entries(s.techniques)
    .filter(([, n]) => n > 0)
    .map(([t, n]) => `${t} ×${n}`);
  lines.push(
    `motion ${s.totalMotion}, best ${s.bestTotalMotion}, smoothness ${s.smoothness.toFixed(2)}, ` +
      `tempo spread ${s.tempo.spread ?? "–"}, score ${s.score}/100`,
  );
  lines.push(`flags: ${flagList.join(", ") || "none"}`);
  lines.push(`techniques: ${techList.join(", ") || "none"}`);
  lines.push(`top line: ${s.topLine.join(" ")}`);
  if (s.accuracy !== undefined) {
    lines.push(`target ${s.target}: accuracy ${(s.accuracy * 100).toFixed(0)}% over ${s.loops} loop(s)`);
    for (const m of s.mismatches ?? []) {
      lines.push(
        `  ${m.kind} at target ${m.targetIndex === null ? "–" : m.targetIndex + 1}, played ${m.playedIndex === null ? "–" : m.playedIndex + 1}${m.expected ? ` (expected ${m.expected})` : ""}`,
      );
    }
  }
  return lines.join("\n");
}

function main(): number {
  let args: Args;
  try {
    args = readArgs(process.argv.slice(2));
  } catch (e) {
    process.stderr.write(`${(e as Error).message}\n`);
    return 2;
  }
  const results: TakeAnalysis[] = [];
  for (const file of args.files) {
    try {
      let bytes: Uint8Array;
      try {
        bytes = new Uint8Array(readFileSync(file));
      } catch {
        throw new UsageError(`${file}: cannot read this file`);
      }
      const analysis = analyseMidi(bytes, { key: args.key, target: args.target });
      if (args.json) results.push(analysis);
      else process.stdout.write(`${formatTable(file, analysis)}\n\n`);
    } catch (e) {
      const known = e instanceof AnalysisError || e instanceof ProgressionError || e instanceof UsageError;
      const message = known
        ? (e as Error).message
        : `could not analyse this file (${String((e as Error)?.message ?? e)})`;
      process.stderr.write(`${file}: ${message.replace(/\s+/g, " ")}\n`.replace(`${file}: ${file}: `, `${file}: `));
      return 1;
    }
  }
  if (args.json) process.stdout.write(`${JSON.stringify(results.length === 1 ? results[0] : results, null, 2)}\n`);
  return 0;
}

process.exitCode = main();
