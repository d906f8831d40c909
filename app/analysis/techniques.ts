// Techniques a chord or a take shows: RULES.md rules 13 and 14.
import { pc } from "./pitch";
import type { ChordName, ChordTechnique } from "./types";

export type ChordShape = {
  name: ChordName;
  inversion: number | null;
  upperInversion: number | null;
  detachedBass: number | null;
  voicing: "close" | "open";
  /** MIDI numbers of the notes each grace note resolves to, with the grace note's own pitch */
  graces: Array<{ note: number; resolvesTo: number }>;
};

/** The pitch class of the chord's 3rd, or null for a chord without one. */
function thirdPc(name: ChordName): number | null {
  if (name.rootPc === null) return null;
  const names = name.intervalNames;
  if (names[4] === "3M") return pc(name.rootPc + 4);
  if (names[3] === "3m") return pc(name.rootPc + 3);
  return null;
}

/** Rule 14, per chord. */
export function chordTechniques(shape: ChordShape): ChordTechnique[] {
  const { name } = shape;
  const found: ChordTechnique[] = [];
  // A major or minor triad (3rd kept, not sus) with its 2nd/9th added.
  if ((name.triad === "major" || name.triad === "minor") && name.rootPc !== null && name.intervals.includes(2)) {
    found.push("added-second");
  }
  const inv = shape.detachedBass === null ? shape.inversion : shape.upperInversion;
  if (inv !== null && inv >= 1 && inv <= 3) found.push("inversion");
  if (shape.voicing === "open") found.push("open-voicing");
  if (shape.detachedBass !== null && shape.inversion !== null && shape.inversion >= 1) found.push("slash-bass");
  const third = thirdPc(name);
  if (
    third !== null &&
    shape.graces.some((g) => pc(g.resolvesTo) === third && g.resolvesTo - g.note >= 1 && g.resolvesTo - g.note <= 2)
  ) {
    found.push("grace-to-third");
  }
  return found;
}

/** Share of changes whose top note moves by 2 semitones or less (null without changes). */
export function smoothTopLineShare(topNotes: number[]): number | null {
  if (topNotes.length < 2) return null;
  let smooth = 0;
  for (let i = 1; i < topNotes.length; i++) if (Math.abs(topNotes[i] - topNotes[i - 1]) <= 2) smooth++;
  return smooth / (topNotes.length - 1);
}

/** Rule 13: at least 75% of the changes move the top note by 2 semitones or less. */
export function hasSmoothTopLine(topNotes: number[]): boolean {
  const share = smoothTopLineShare(topNotes);
  return share !== null && share >= 0.75;
}
