// Roman numerals as teachers write them (RULES.md rule 21 and "Progressions as teachers write
// them"): read for target progressions and printed for the chords a take played, so that
// whatever we print reads back as the same chord.
import {
  degreeInKey,
  type Key,
  MAJOR_SCALE,
  NATURAL_MINOR_SCALE,
  onLetter,
  pc,
  spellDegree,
  type Spelled,
  spellRoot,
} from "./pitch";
import type { TargetChord } from "./progression";

export type Triad = "major" | "minor" | "diminished" | "augmented" | "sus2" | "sus4";

export const TRIAD_INTERVALS: Record<Triad, number[]> = {
  major: [0, 4, 7],
  minor: [0, 3, 7],
  diminished: [0, 3, 6],
  augmented: [0, 4, 8],
  sus2: [0, 2, 7],
  sus4: [0, 5, 7],
};

const sameSet = (x: number[], y: number[]) => x.length === y.length && x.every((v) => y.includes(v));

const NUMERALS = ["I", "II", "III", "IV", "V", "VI", "VII"];

type RomanSuffix = { text: string; sus?: "sus2" | "sus4"; required: number[] };
// Suffixes after a Roman numeral as teachers write them (RULES.md rule 21): quality and
// extensions, never raw interval lists. A bare 6 is never an added sixth (that is `add6`):
// 6 and 64 are figures of an inverted triad, 65, 43 and 42 of an inverted seventh chord.
// The first entry with a given text is the one the parser reads; later ones with the same
// text let the printer name a chord that leaves a tone out (a 13th without its 9th is V13).
const ROMAN_SUFFIX_LIST: RomanSuffix[] = [
  { text: "", required: [] },
  { text: "7", required: [10] },
  { text: "maj7", required: [11] },
  { text: "add6", required: [9] },
  { text: "69", required: [9, 2] },
  { text: "add9", required: [2] },
  { text: "add11", required: [5] },
  { text: "9", required: [10, 2] },
  { text: "maj9", required: [11, 2] },
  { text: "11", required: [10, 2, 5] },
  { text: "13", required: [10, 2, 9] },
  { text: "maj13", required: [11, 2, 9] },
  { text: "7b9", required: [10, 1] },
  { text: "7#9", required: [10, 3] },
  { text: "7#11", required: [10, 6] },
  { text: "7b13", required: [10, 8] },
  { text: "maj7#11", required: [11, 6] },
  { text: "9#11", required: [10, 2, 6] },
  { text: "maj9#11", required: [11, 2, 6] },
  { text: "13#11", required: [10, 2, 6, 9] },
  { text: "9b13", required: [10, 2, 8] },
  { text: "7b9b13", required: [10, 1, 8] },
  { text: "7#9b13", required: [10, 3, 8] },
  { text: "13b9", required: [10, 1, 9] },
  { text: "13#9", required: [10, 3, 9] },
  { text: "sus4", sus: "sus4", required: [] },
  { text: "sus2", sus: "sus2", required: [] },
  { text: "7sus4", sus: "sus4", required: [10] },
  { text: "7sus2", sus: "sus2", required: [10] },
  { text: "9sus4", sus: "sus4", required: [10, 2] },
  { text: "13sus4", sus: "sus4", required: [10, 2, 9] },
  { text: "maj7sus4", sus: "sus4", required: [11] },
  { text: "7b9sus4", sus: "sus4", required: [10, 1] },
  // Printed names of chords that leave out a tone their symbol usually holds.
  { text: "11", required: [10, 5] },
  { text: "13", required: [10, 9] },
  { text: "maj13", required: [11, 9] },
  { text: "13#11", required: [10, 6, 9] },
  { text: "13sus4", sus: "sus4", required: [10, 9] },
];
const ROMAN_ALIASES: Record<string, string> = {
  M7: "maj7",
  Δ7: "maj7",
  Δ: "maj7",
  add2: "add9",
  sus: "sus4",
  "7sus": "7sus4",
  "9sus": "9sus4",
};
const ROMAN_SUFFIXES = new Map<string, RomanSuffix>();
for (const s of ROMAN_SUFFIX_LIST) if (!ROMAN_SUFFIXES.has(s.text)) ROMAN_SUFFIXES.set(s.text, s);

/** Figured-bass figures (common practice; e.g. S. Kostka & D. Payne, *Tonal Harmony*, from memory). */
const TRIAD_FIGURES = ["", "6", "64"];
const SEVENTH_FIGURES = ["7", "65", "43", "42"];

const thirdOf = (t: Triad) => (t === "minor" || t === "diminished" ? 3 : 4);
const fifthOf = (t: Triad) => (t === "diminished" ? 6 : t === "augmented" ? 8 : 7);

/** A Roman numeral read in the key; `fail` builds the error naming the token. */
export type RomanParts = {
  root: number;
  triad: Triad;
  bass: number | null;
  required: number[];
  rootName: string;
  roman: string;
};

export function readRoman(token: string, key: Key, fail: (why?: string) => Error): RomanParts {
  const m = /^([b#♭♯]?)(VII|VI|V|IV|III|II|I|vii|vi|v|iv|iii|ii|i)(°|o|ø|\+)?(.*?)(?:\/([b#♭♯]?)([1-7]))?$/.exec(token);
  if (!m) throw fail();
  const [, accidental, numeral, mark, suffix, bassAccidental, bassDegree] = m;
  const degree = NUMERALS.indexOf(numeral.toUpperCase());
  const upper = numeral === numeral.toUpperCase();
  let triad: Triad = upper ? "major" : "minor";
  let required: number[] = [];
  const diminished = mark === "°" || mark === "o";
  if (diminished || mark === "ø") triad = "diminished";
  if (mark === "+") triad = "augmented";

  const figure = /^(maj)?(6|64|65|43|42)$/.exec(suffix);
  let inversion = 0;
  if (figure) {
    const seventh = SEVENTH_FIGURES.includes(figure[2]);
    if (!seventh && (figure[1] || mark === "ø")) throw fail("6 and 64 are figures of a triad");
    if (figure[1] && (diminished || mark === "ø")) throw fail();
    inversion = seventh ? SEVENTH_FIGURES.indexOf(figure[2]) : TRIAD_FIGURES.indexOf(figure[2]);
    if (seventh) required = figure[1] ? [11] : diminished ? [9] : [10];
  } else if (mark === "ø") {
    if (suffix !== "" && suffix !== "7") throw fail("a half-diminished chord takes only 7");
    required = [10];
  } else if (diminished) {
    if (suffix === "7")
      required = [9]; // fully diminished seventh
    else if (suffix !== "") throw fail("a diminished chord takes only 7");
  } else {
    const ext = ROMAN_SUFFIXES.get(ROMAN_ALIASES[suffix] ?? suffix);
    if (!ext || (ext.sus && mark)) throw fail();
    if (ext.sus) triad = ext.sus;
    required = ext.required.slice();
  }
  if (mark === "ø" && required.length === 0) required = [10];
  if (figure && bassDegree) throw fail("a figure already names the bass");

  let alter = accidental === "b" || accidental === "♭" ? -1 : accidental === "#" || accidental === "♯" ? 1 : 0;
  // Common practice: in minor, vii° and viiø sit on the raised seventh (the leading tone), so
  // a diminished chord on the natural seventh is written bvii°.
  if (key.mode === "minor" && degree === 6 && triad === "diminished") alter += 1;
  const scale = key.mode === "major" ? MAJOR_SCALE : NATURAL_MINOR_SCALE;
  const root = pc(key.tonic + scale[degree] + alter);
  let bass: number | null = null;
  if (inversion > 0) bass = pc(root + [0, thirdOf(triad), fifthOf(triad), required[0] ?? 10][inversion]);
  if (bassDegree) {
    const bassAlter = bassAccidental === "b" || bassAccidental === "♭" ? -1 : bassAccidental ? 1 : 0;
    const b = pc(key.tonic + scale[Number(bassDegree) - 1] + bassAlter);
    bass = b === root ? null : b;
  }
  const normalisedMark = mark === "o" ? "°" : (mark ?? "");
  const norm = (a: string) => a.replace("♭", "b").replace("♯", "#");
  const roman =
    norm(accidental) + numeral + normalisedMark + suffix + (bassDegree ? `/${norm(bassAccidental)}${bassDegree}` : "");
  return { root, triad, bass, required, rootName: spellDegree(key, degree, alter), roman };
}

/** Quality mark and suffix of a chord after its numeral ("7", "maj9", "°7", "ø7", "+", "7sus4"). */
function qualityText(triad: Triad, required: number[]): { text: string; seventh: boolean } {
  const exact = (r: number[]) => sameSet(r, required);
  if (triad === "diminished") {
    if (required.includes(10)) return { text: "ø7", seventh: exact([10]) };
    if (required.includes(9)) return { text: "°7", seventh: exact([9]) };
    return { text: "°", seventh: false };
  }
  const sus = triad === "sus2" || triad === "sus4" ? triad : undefined;
  const candidates = ROMAN_SUFFIX_LIST.filter(
    (s) => s.sus === sus && (triad !== "augmented" || s.required.length <= 1),
  );
  // The entry naming exactly these tones, else the one naming most of them and nothing else.
  let best: RomanSuffix | undefined = candidates.find((s) => exact(s.required));
  if (!best) {
    for (const s of candidates) {
      if (s.required.every((r) => required.includes(r)) && (!best || s.required.length > best.required.length))
        best = s;
    }
  }
  const text = best?.text ?? sus ?? "";
  const seventh = !sus && best !== undefined && exact(best.required) && (text === "7" || text === "maj7");
  return { text: (triad === "augmented" ? "+" : "") + text, seventh };
}

/** Letter steps above the root of a chord tone `semitones` above it (3rd = 2, 7th = 6, 9th = 1). */
function letterSteps(semitones: number, triad: Triad): number {
  switch (semitones) {
    case 0:
      return 0;
    case 1:
    case 2:
      return 1;
    case 3:
      return triad === "minor" || triad === "diminished" ? 2 : 1;
    case 4:
      return 2;
    case 5:
      return 3;
    case 6:
      return triad === "diminished" ? 4 : 3;
    case 7:
      return 4;
    case 8:
      return triad === "augmented" ? 4 : 5;
    case 9:
      return triad === "diminished" ? 6 : 5;
    default:
      return 6;
  }
}

export type RomanOptions = {
  /** Pitch class of the bass: inverted triads and sevenths take figures, other basses `/degree`. */
  bass?: number | null;
  /** The root as spelled for its function (a diminished seventh before its resolution). */
  root?: Spelled;
};

/**
 * The Roman numeral of a chord in the key as teachers write it (RULES.md rule 21): `V7`, `bVII`,
 * `iiø7`, `V13`, `Imaj9`, `IVadd6`; with a bass, figures for inverted triads and seventh chords
 * (`I6`, `I64`, `V65`, `V43`, `V42`) and `/degree` for any other bass (`IV/5`). A foreign root is
 * spelled by pitch.ts's `spellRoot` (fewer accidentals, the flat one on a tie: `bII`, not `#I`).
 */
export function romanFor(
  chord: Pick<TargetChord, "root" | "triad" | "required">,
  key: Key,
  opts: RomanOptions = {},
): string {
  let rootSpelling = opts.root ?? spellRoot(chord.root, key);
  let { degree, alter } = degreeInKey(rootSpelling, key);
  if (Math.abs(alter) > 1) {
    rootSpelling = spellRoot(chord.root, key);
    ({ degree, alter } = degreeInKey(rootSpelling, key));
  }
  // The parser puts vii° and viiø in minor on the raised seventh without an accidental.
  if (key.mode === "minor" && degree === 6 && chord.triad === "diminished") alter -= 1;
  const numeral =
    chord.triad === "minor" || chord.triad === "diminished" ? NUMERALS[degree].toLowerCase() : NUMERALS[degree];
  const accidental = alter < 0 ? "b".repeat(-alter) : "#".repeat(alter);
  const { text, seventh } = qualityText(chord.triad, chord.required);
  const head = accidental + numeral;
  const bass = opts.bass === undefined || opts.bass === null ? null : pc(opts.bass);
  if (bass === null || bass === pc(chord.root)) return head + text;

  const above = pc(bass - chord.root);
  const plainTriad = chord.required.length === 0 && chord.triad !== "sus2" && chord.triad !== "sus4";
  if (plainTriad && (above === thirdOf(chord.triad) || above === fifthOf(chord.triad))) {
    return head + text + (above === fifthOf(chord.triad) ? "64" : "6");
  }
  if (seventh) {
    const figure =
      above === thirdOf(chord.triad)
        ? "65"
        : above === fifthOf(chord.triad)
          ? "43"
          : above === chord.required[0]
            ? "42"
            : null;
    if (figure) return head + text.replace(/7$/, figure);
  }
  // Any other bass: its scale degree, spelled from the root when it is a chord tone.
  const tones = new Set([...TRIAD_INTERVALS[chord.triad], ...chord.required].map((i) => pc(i)));
  let bassSpelling = tones.has(above)
    ? onLetter(bass, rootSpelling.letter + letterSteps(above, chord.triad))
    : spellRoot(bass, key);
  let bassDegree = degreeInKey(bassSpelling, key);
  if (Math.abs(bassDegree.alter) > 1 || Math.abs(bassSpelling.alter) > 1) {
    bassSpelling = spellRoot(bass, key);
    bassDegree = degreeInKey(bassSpelling, key);
  }
  const bassAccidental = bassDegree.alter < 0 ? "b" : bassDegree.alter > 0 ? "#" : "";
  return `${head}${text}/${bassAccidental}${bassDegree.degree + 1}`;
}
