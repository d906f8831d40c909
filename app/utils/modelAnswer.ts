// The model answer of an exercise: from a starting voicing the teacher picks, the smoothest
// voicing of each next target chord, chained with the engine's best motion (rule 8), shaped by
// the exercise's focus techniques (open voicings, added 2nds, a left-hand bass, grace notes to
// the 3rd, a stepwise top line) and explained one sentence per choice. Pure, so the exercise
// page recomputes it in the browser while the teacher picks keys.
import { bestMotion } from "~/analysis/bestMotion";
import { voicingOf } from "~/analysis/naming";
import { pc, type Key } from "~/analysis/pitch";
import { suffixFor, targetPcs, type TargetChord } from "~/analysis/progression";
import { motion } from "~/analysis/voiceLeading";
import { noteLabel, pretty } from "./noteText";

export type ModelStep = {
  symbol: string;
  roman: string | null;
  voicing: number[];
  motion: number | null;
  /** a grace note struck just before the chord, a step below its 3rd (focus grace-to-third) */
  grace?: number | null;
};
export type ModelPath = { steps: ModelStep[]; totalMotion: number; choices?: string[] };

/** How the model answer is shaped: the exercise's focus techniques and the key its notes are named in. */
export type ModelOptions = { focus?: readonly string[]; key?: Key | null; teacherStart?: boolean };

// One accept function per bass pitch class: best motion caches its results per function.
const bassAccepts = new Map<number, (v: number[]) => boolean>();
function bassIs(bass: number) {
  let f = bassAccepts.get(bass);
  if (!f) {
    f = (v: number[]) => pc(v[0]) === bass;
    bassAccepts.set(bass, f);
  }
  return f;
}

/** The chord's tones stacked upwards from the first one at or above `floor` (the named bass first). */
export function closeVoicing(chord: TargetChord, floor: number): number[] {
  const pcs = targetPcs(chord);
  const bottom = chord.bass ?? chord.root;
  const order = [bottom, ...pcs.filter((p) => p !== bottom).sort((a, b) => pc(a - bottom) - pc(b - bottom))];
  const out: number[] = [];
  let at = floor;
  for (const p of order) {
    let n = at + pc(p - at);
    if (out.length && n <= out[out.length - 1]) n += 12;
    out.push(n);
    at = n;
  }
  return out;
}

/** The default start: the first chord in close position from the C below middle C's octave (C4 = 60). */
export function defaultStart(first: TargetChord): number[] {
  return closeVoicing(first, 57);
}

/** Whether a picked voicing holds exactly the first chord's pitch classes (and its named bass at the bottom). */
export function fitsFirstChord(voicing: readonly number[], first: TargetChord): boolean {
  if (voicing.length < 2) return false;
  const want = new Set(targetPcs(first));
  const have = new Set(voicing.map(pc));
  if (want.size !== have.size || [...want].some((p) => !have.has(p))) return false;
  return first.bass === null || pc(Math.min(...voicing)) === first.bass;
}

/** Moves a start voicing picked in one key to another by the nearest shift (−5 … +6 semitones). */
export function shiftStart(voicing: readonly number[], fromTonic: number, toTonic: number): number[] {
  let d = pc(toTonic - fromTonic);
  if (d > 6) d -= 12;
  return voicing.map((n) => n + d);
}

/**
 * The smoothest path through `chords` from `start`: each next chord is the voicing of its
 * tones (bass fixed when the target names one) with the least motion from the previous one.
 * With focus techniques the path follows them (see focusedPath).
 */
export function modelPath(
  chords: readonly TargetChord[],
  start: readonly number[],
  options: ModelOptions = {},
): ModelPath {
  if (chords.length === 0) return { steps: [], totalMotion: 0, choices: [] };
  if (options.focus?.length) return focusedPath(chords, start, options);
  const first = [...start].sort((a, b) => a - b);
  const steps: ModelStep[] = [{ symbol: chords[0].symbol, roman: chords[0].roman, voicing: first, motion: null }];
  let total = 0;
  for (let i = 1; i < chords.length; i++) {
    const prev = steps[i - 1].voicing;
    const chord = chords[i];
    const seed = closeVoicing(chord, prev[0] - 6);
    const found = bestMotion(prev, seed, chord.bass === null ? {} : { accept: bassIs(chord.bass) });
    const voicing = found?.voicing ?? seed;
    const m = found?.motion ?? motion(prev, voicing);
    total += m;
    steps.push({ symbol: chord.symbol, roman: chord.roman, voicing, motion: m });
  }
  return { steps, totalMotion: total, choices: [smoothestSentence(total)] };
}

const smoothestSentence = (total: number) =>
  `Each next chord takes the voicing of its tones that moves least from the one before: ${total} semitone${total === 1 ? "" : "s"} of motion in all.`;

/** Rule 6's reading: open when a chord tone fits between two adjacent notes above the bass. */
export function isOpen(voicing: readonly number[]): boolean {
  return voicingOf(voicing.slice(1), new Set(voicing.map(pc))) === "open";
}

/** A close voicing spread open: its second note from the bottom goes up an octave (C E G → C G E). */
export function spreadOpen(voicing: readonly number[]): number[] {
  const v = [...voicing].sort((a, b) => a - b);
  if (v.length < 3 || isOpen(v)) return v;
  return [v[0], ...v.slice(2), v[1] + 12].sort((a, b) => a - b);
}

/** The chord with its 2nd added, when it is a plain major or minor triad (common practice: add2/add9; a 7th chord would become a 9th). */
function withAddedSecond(chord: TargetChord): TargetChord {
  if ((chord.triad !== "major" && chord.triad !== "minor") || chord.required.length > 0) return chord;
  const required = [...chord.required, 2];
  const symbol = chord.symbol.replace(
    /^([A-G][#b]?)([^/]*)(\/.*)?$/,
    (_, root: string, _suffix: string, bass = "") => root + suffixFor(chord.triad, required) + bass,
  );
  return { ...chord, required, symbol };
}

/** The nearest note of pitch class `p` to `near` (the lower on a tie). */
function nearest(p: number, near: number): number {
  const up = near + pc(p - near);
  return up - near > 6 ? up - 12 : up;
}

/** The grace note for a chord: a half step below its 3rd in the voicing (or a whole step when that is a chord tone). */
function graceFor(chord: TargetChord, voicing: readonly number[]): number | null {
  const third =
    chord.triad === "major" || chord.triad === "augmented"
      ? 4
      : chord.triad === "minor" || chord.triad === "diminished"
        ? 3
        : null;
  if (third === null) return null;
  const thirdNote = voicing.find((n) => pc(n) === pc(chord.root + third));
  if (thirdNote === undefined) return null;
  const tones = new Set(targetPcs(chord));
  return tones.has(pc(thirdNote - 1)) ? thirdNote - 2 : thirdNote - 1;
}

const LEFT_HAND_TOP = 50; // D3: a left-hand bass note sits at or below it (common practice for a detached bass)

/**
 * The path shaped by the focus techniques: each chord is still the least-moving voicing of its
 * tones, among those that do what the exercise practises; when none does (a chord cannot be
 * voiced open in its notes' range), the plain smoothest voicing stands and the choice says so.
 */
function focusedPath(chordsIn: readonly TargetChord[], start: readonly number[], options: ModelOptions): ModelPath {
  const focus = new Set(options.focus);
  const key = options.key ?? null;
  const name = (n: number) => noteLabel(n, key);
  const chords = focus.has("added-second") ? chordsIn.map(withAddedSecond) : [...chordsIn];
  const leftHand = focus.has("slash-bass");
  const choices: string[] = [];

  // The start: the teacher's voicing, or the first chord close from below middle C, then shaped.
  let first = [...start].sort((a, b) => a - b);
  if (focus.has("added-second") && chords[0] !== chordsIn[0]) {
    const second = pc(chords[0].root + 2);
    if (!first.some((n) => pc(n) === second))
      first = [...first, nearest(second, first[first.length - 1] - 3)].sort((a, b) => a - b);
  }
  if (focus.has("open-voicing") && !isOpen(first)) first = spreadOpen(first);
  let bass = leftHand ? nearest(chords[0].bass ?? chords[0].root, 43) : null;
  if (bass !== null) {
    while (bass > LEFT_HAND_TOP || bass >= first[0] - 7) bass -= 12;
    first = first.filter((n) => n !== bass);
  }
  const steps: ModelStep[] = [
    {
      symbol: chords[0].symbol,
      roman: chords[0].roman,
      voicing: bass === null ? first : [bass, ...first],
      motion: null,
    },
  ];
  const basses: number[] = bass === null ? [] : [bass];
  let total = 0;
  const missedOpen: string[] = [];
  const missedTop: string[] = [];
  for (let i = 1; i < chords.length; i++) {
    const chord = chords[i];
    const prevFull = steps[i - 1].voicing;
    const prev = leftHand ? prevFull.slice(1) : prevFull;
    const prevTop = prev[prev.length - 1];
    // The left hand plays the bass, so the right hand's lowest note need not be it.
    const namedBass = leftHand ? null : chord.bass;
    const seed = closeVoicing(leftHand ? { ...chord, bass: null } : chord, prev[0] - 6);
    const wants = {
      open: focus.has("open-voicing"),
      top: focus.has("smooth-top-line"),
    };
    const test = (open: boolean, top: boolean) => (v: number[]) =>
      (namedBass === null || pc(v[0]) === namedBass) &&
      (!open || isOpen(v)) &&
      (!top || Math.abs(v[v.length - 1] - prevTop) <= 2);
    let found = bestMotion(prev, seed, { accept: test(wants.open, wants.top) });
    if (!found && wants.top) {
      missedTop.push(pretty(chord.symbol));
      found = bestMotion(prev, seed, { accept: test(wants.open, false) });
    }
    if (!found && wants.open) {
      missedOpen.push(pretty(chord.symbol));
      found = bestMotion(prev, seed, { accept: test(false, false) });
    }
    const upper = found?.voicing ?? seed;
    let voicing = upper;
    if (leftHand) {
      let b = nearest(chord.bass ?? chord.root, basses[basses.length - 1]);
      while (b > LEFT_HAND_TOP || b >= upper[0] - 7) b -= 12;
      basses.push(b);
      voicing = [b, ...upper];
    }
    const m = motion(prevFull, voicing);
    total += m;
    steps.push({ symbol: chord.symbol, roman: chord.roman, voicing, motion: m });
  }
  if (focus.has("grace-to-third"))
    for (const [i, s] of steps.entries()) s.grace = graceFor(chords[i], leftHand ? s.voicing.slice(1) : s.voicing);

  // One sentence per choice, in the order a student reads the path.
  choices.push(
    options.teacherStart
      ? `It starts from the voicing your teacher picked for ${pretty(chords[0].symbol)}: ${steps[0].voicing.map(name).join(" ")}.`
      : `It starts on ${pretty(chords[0].symbol)} as ${steps[0].voicing.map(name).join(" ")}.`,
  );
  choices.push(smoothestSentence(total));
  if (focus.has("open-voicing")) {
    choices.push(
      missedOpen.length
        ? `Every chord is voiced open (a chord tone would fit between two of its upper notes), except ${missedOpen.join(", ")}, which has no open voicing near the one before.`
        : "Every chord is voiced open, as the exercise practises: a chord tone would fit between two of its upper notes, so the sound is wider than close position.",
    );
  }
  if (focus.has("added-second")) {
    const added = chords.flatMap((c, i) =>
      c !== chordsIn[i]
        ? [
            `${name(steps[i].voicing.find((n) => pc(n) === pc(c.root + 2)) ?? c.root).replace(/-?\d+$/, "")} in ${pretty(chordsIn[i].symbol)}`,
          ]
        : [],
    );
    choices.push(
      added.length
        ? `Each plain major or minor triad adds its 2nd, as the exercise practises: ${[...new Set(added)].join(", ")}.`
        : "No chord here is a plain major or minor triad, so no 2nd is added.",
    );
  }
  if (focus.has("inversion")) {
    const inverted = steps.flatMap((s, i) => {
      const low = leftHand ? s.voicing[1] : s.voicing[0];
      return pc(low) === chords[i].root
        ? []
        : [`${pretty(chords[i].symbol)} with ${name(low).replace(/-?\d+$/, "")} lowest`];
    });
    choices.push(
      inverted.length
        ? `Inversions keep the hand in one place: ${[...new Set(inverted)].join(", ")}.`
        : "Every chord stays in root position here: no inversion moves less.",
    );
  }
  if (leftHand) {
    const line = steps.map((s) => name(s.voicing[0])).join(" → ");
    const slashes = steps.flatMap((s, i) =>
      pc(s.voicing[0]) === chords[i].root
        ? []
        : [`${pretty(chords[i].symbol.split("/")[0])}/${name(s.voicing[0]).replace(/-?\d+$/, "")}`],
    );
    choices.push(
      `The left hand plays the bass apart from the chord: ${line}${slashes.length ? `, so ${[...new Set(slashes)].join(", ")} sound as slash chords` : ""}.`,
    );
  }
  if (focus.has("grace-to-third")) {
    const graces = steps.flatMap((s, i) =>
      s.grace == null
        ? []
        : [
            `${name(s.grace).replace(/-?\d+$/, "")} to ${name(s.grace + (pc(s.grace + 1) === pc(chords[i].root + 3) || pc(s.grace + 1) === pc(chords[i].root + 4) ? 1 : 2)).replace(/-?\d+$/, "")} in ${pretty(chords[i].symbol)}`,
          ],
    );
    choices.push(
      graces.length
        ? `A grace note a step below each 3rd slides into it: ${graces.join(", ")}.`
        : "These chords have no 3rd to slide into, so there are no grace notes.",
    );
  }
  if (focus.has("smooth-top-line")) {
    const tops = steps.map((s) => name(s.voicing[s.voicing.length - 1]));
    choices.push(
      missedTop.length
        ? `The top line moves by step or stays (${tops.join(" → ")}), except into ${missedTop.join(", ")}, where no voicing keeps it that close.`
        : `The top line moves by step or stays: ${tops.join(" → ")}.`,
    );
  }
  return { steps, totalMotion: total, choices };
}

/** The path as notes for the synth: each chord held two beats at the exercise's tempo (72 bpm without one). */
export function pathPlan(
  steps: readonly ModelStep[],
  tempo: number | null,
): Array<{ midi: number; start: number; end: number; velocity: number }> {
  const beat = 60 / (tempo ?? 72);
  return steps.flatMap((s, i) => [
    // A grace note sounds just before its chord and stops as the chord sounds.
    ...(s.grace == null
      ? []
      : [{ midi: s.grace, start: Math.max(0, i * 2 * beat - 0.09), end: i * 2 * beat, velocity: 0.5 }]),
    ...s.voicing.map((midi) => ({ midi, start: i * 2 * beat, end: (i * 2 + 1.9) * beat, velocity: 0.7 })),
  ]);
}

/** The starting voicing for one key: the teacher's (picked in the first key) moved there, when it still fits. */
export function startForKey(
  saved: readonly number[] | null,
  homeTonic: number,
  keyTonic: number,
  first: TargetChord,
): number[] {
  if (saved && saved.length) {
    const moved = shiftStart(saved, homeTonic, keyTonic);
    if (fitsFirstChord(moved, first)) return moved;
  }
  return defaultStart(first);
}
