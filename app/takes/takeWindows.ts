// A long take's analysis travels to the browser in windows: the page carries the summary,
// a compact time line of every harmony (start, end, name, Roman numeral, flags) and the
// first window of changes; further windows come from /api/takes/:id/window?from=N as the
// student scrolls or jumps. A window holds WINDOW_SIZE changes, the chords they join, and
// the notes and melody notes that sound in its stretch of time.
import type {
  ChangeFlag,
  ChangeReport,
  ChordFlag,
  ChordReport,
  MelodyNote,
  NoteEvent,
  TakeAnalysis,
} from "~/analysis/types";
import { packNotes, unpackNotes } from "./packNotes";

/** Changes per window (the change list shows the same number per page). */
export const WINDOW_SIZE = 40;

/**
 * Every harmony and change in few bytes. `chords` is one string of whole numbers: per chord
 * the start in hundredths of a second after the previous chord's start, its length in
 * hundredths, and an index into `labels` (name, Roman numeral and flags, each combination
 * listed once). `changes` holds per change an index into `changeFlags`.
 */
export type Timeline = {
  chordCount: number;
  changeCount: number;
  /** lowest and highest key played, so the roll keeps its height while windows arrive */
  range: [number, number] | null;
  labels: Array<[symbol: string | null, roman: string | null, flags: ChordFlag[]]>;
  chords: string;
  changeFlags: ChangeFlag[][];
  changes: string;
};

export type TakeWindow = {
  /** index of the first change (a multiple of WINDOW_SIZE) */
  from: number;
  /** index of the first chord carried (equal to `from`: change i joins chords i and i + 1) */
  changes: ChangeReport[];
  chords: ChordReport[];
  /** melody notes starting in the window's stretch of time, packed (see packMelody) */
  melody: PackedMelody;
  /** notes starting in the window's stretch of time, packed (see packNotes) */
  notes: number[];
};

/** Melody notes as whole numbers (start ms, end ms, key, index of its spelled name in `names`). */
export type PackedMelody = { names: string[]; packed: number[] };

export function packMelody(notes: readonly MelodyNote[]): PackedMelody {
  const names: string[] = [];
  const at = new Map<string, number>();
  const packed: number[] = [];
  for (const m of notes) {
    let i = at.get(m.noteName);
    if (i === undefined) {
      i = names.length;
      names.push(m.noteName);
      at.set(m.noteName, i);
    }
    packed.push(Math.round(m.startSec * 1000), Math.round(m.endSec * 1000), m.note, i);
  }
  return { names, packed };
}

export function unpackMelody({ names, packed }: PackedMelody): MelodyNote[] {
  const out: MelodyNote[] = [];
  for (let i = 0; i + 3 < packed.length; i += 4)
    out.push({
      startSec: packed[i] / 1000,
      endSec: packed[i + 1] / 1000,
      note: packed[i + 2],
      noteName: names[packed[i + 3]],
    });
  return out;
}

/** The window that holds change (or chord) `index`. */
export function windowStart(index: number): number {
  return Math.max(0, Math.floor(index / WINDOW_SIZE) * WINDOW_SIZE);
}

/** How many windows a take with this many changes has (at least one). */
export function windowCount(changeCount: number): number {
  return Math.max(1, Math.ceil(changeCount / WINDOW_SIZE));
}

export function timelineOf(
  analysis: Pick<TakeAnalysis, "chords" | "changes">,
  notes: readonly NoteEvent[] = [],
): Timeline {
  const labels: Timeline["labels"] = [];
  const labelIdx = new Map<string, number>();
  const nums: number[] = [];
  let prev = 0;
  for (const c of analysis.chords) {
    const label: Timeline["labels"][number] = [c.symbol, c.roman, c.flags];
    const key = JSON.stringify(label);
    let i = labelIdx.get(key);
    if (i === undefined) {
      i = labels.length;
      labels.push(label);
      labelIdx.set(key, i);
    }
    const start = Math.round(c.startSec * 100);
    nums.push(start - prev, Math.round(c.endSec * 100) - start, i);
    prev = start;
  }
  const changeFlags: ChangeFlag[][] = [];
  const flagIdx = new Map<string, number>();
  const changeNums = analysis.changes.map((c) => {
    const key = c.flags.join(",");
    let i = flagIdx.get(key);
    if (i === undefined) {
      i = changeFlags.length;
      changeFlags.push(c.flags);
      flagIdx.set(key, i);
    }
    return i;
  });
  let lo = Infinity;
  let hi = -Infinity;
  for (const n of notes) {
    if (n.midi < lo) lo = n.midi;
    if (n.midi > hi) hi = n.midi;
  }
  return {
    chordCount: analysis.chords.length,
    changeCount: analysis.changes.length,
    range: notes.length ? [lo, hi] : null,
    labels,
    chords: nums.join(","),
    changeFlags,
    changes: changeNums.join(","),
  };
}

/** The stretch of time a window owns: notes starting in [start, end) belong to it. */
function windowTimes(chords: readonly ChordReport[], from: number, changeCount: number): [number, number] {
  const start = from === 0 ? -Infinity : chords[from].startSec;
  const next = from + WINDOW_SIZE;
  const end = next >= changeCount || !chords[next] ? Infinity : chords[next].startSec;
  return [start, end];
}

/**
 * The window starting at change `from` (rounded down to a window's start and kept inside the
 * take): its changes, the chords they join (the last window also every chord after), and the
 * notes and melody notes that start in its stretch of time.
 */
export function windowOf(
  analysis: Pick<TakeAnalysis, "chords" | "changes" | "melodyNotes">,
  notes: readonly NoteEvent[],
  from: number,
): TakeWindow {
  const { chords, changes } = analysis;
  const last = (windowCount(changes.length) - 1) * WINDOW_SIZE;
  const start = Math.min(windowStart(Number.isFinite(from) ? from : 0), last);
  const isLast = start === last;
  const chordEnd = isLast ? chords.length : Math.min(chords.length, start + WINDOW_SIZE + 1);
  const [t0, t1] = windowTimes(chords, start, changes.length);
  const inTime = (t: number) => t >= t0 && t < t1;
  return {
    from: start,
    changes: changes.slice(start, start + WINDOW_SIZE),
    chords: chords.slice(start, chordEnd),
    melody: packMelody(analysis.melodyNotes.filter((m) => inTime(m.startSec))),
    notes: packNotes(notes.filter((n) => inTime(n.start))),
  };
}

/** Every window of a take, in order (for tests and for playing the whole take). */
export function allWindows(
  analysis: Pick<TakeAnalysis, "chords" | "changes" | "melodyNotes">,
  notes: readonly NoteEvent[],
): TakeWindow[] {
  return Array.from({ length: windowCount(analysis.changes.length) }, (_, w) =>
    windowOf(analysis, notes, w * WINDOW_SIZE),
  );
}

/** The time line read back: each chord's start, end, symbol, Roman numeral and flags, each change's flags. */
export function readTimeline(t: Timeline): {
  chords: Array<{ startSec: number; endSec: number; symbol: string | null; roman: string | null; flags: ChordFlag[] }>;
  changeFlags: ChangeFlag[][];
} {
  const nums = t.chords ? t.chords.split(",").map(Number) : [];
  const chords = [];
  let at = 0;
  for (let i = 0; i + 2 < nums.length; i += 3) {
    at += nums[i];
    const [symbol, roman, flags] = t.labels[nums[i + 2]];
    chords.push({ startSec: at / 100, endSec: (at + nums[i + 1]) / 100, symbol, roman, flags });
  }
  const changeFlags = t.changes ? t.changes.split(",").map((i) => t.changeFlags[Number(i)]) : [];
  return { chords, changeFlags };
}

/** A chord known only from the time line: its place, names and flags, no notes yet. */
export function chordStub(c: ReturnType<typeof readTimeline>["chords"][number]): ChordReport {
  return {
    startSec: c.startSec,
    endSec: c.endSec,
    notes: [],
    noteNames: [],
    heldNotes: [],
    graceNotes: [],
    bassLine: [],
    nonChordTones: [],
    root: null,
    bass: "",
    symbol: c.symbol,
    roman: c.roman,
    triad: null,
    quality: null,
    inversion: null,
    upperInversion: null,
    detachedBass: null,
    voicing: "close",
    addedTones: [],
    topNote: 0,
    topNoteName: "",
    pedal: false,
    flags: c.flags,
    techniques: [],
  };
}

/** A change known only from the time line: which chords it joins and its flags. */
export function changeStub(index: number, flags: ChangeFlag[]): ChangeReport {
  return {
    from: index,
    to: index + 1,
    graded: false,
    motion: null,
    bestMotion: null,
    bestVoicing: null,
    suggestions: [],
    bassMotion: 0,
    topVoiceInterval: 0,
    topLineFrom: 0,
    commonTones: 0,
    largestVoiceMove: null,
    flags,
    blurredNotes: [],
  };
}

/**
 * The take as far as it is known: every chord and change (from its window when loaded, else a
 * stub from the time line), the loaded windows' melody notes and notes in time order, and which
 * windows are loaded.
 */
export function stitchWindows(timeline: Timeline, windows: ReadonlyMap<number, TakeWindow>) {
  const read = readTimeline(timeline);
  const chords: ChordReport[] = read.chords.map(chordStub);
  const changes: ChangeReport[] = read.changeFlags.map((f, i) => changeStub(i, f));
  const melodyNotes: MelodyNote[] = [];
  const notes: NoteEvent[] = [];
  const loaded = new Set<number>();
  for (const from of [...windows.keys()].sort((a, b) => a - b)) {
    const w = windows.get(from)!;
    loaded.add(from);
    w.chords.forEach((c, i) => (chords[w.from + i] = c));
    w.changes.forEach((c, i) => (changes[w.from + i] = c));
    melodyNotes.push(...unpackMelody(w.melody));
    notes.push(...unpackNotes(w.notes));
  }
  return { chords, changes, melodyNotes, notes, loaded };
}

/** Names one analysis of one recording: windows fetched under it stay valid until the take is analysed again or replaced. */
export function windowVersion(take: { analysisVersion: number | null; recordedAt: unknown; size: number }): string {
  const stamp = take.recordedAt instanceof Date ? take.recordedAt.getTime() : String(take.recordedAt);
  return `${take.analysisVersion ?? 0}-${take.size}-${stamp}`.replace(/[^\w.-]/g, "");
}
