// Grades each change between consecutive chords: RULES.md rules 7–10 plus the suggestions a
// student sees (smoothest; smoothest keeping the played top note; smoothest keeping the
// played bass), none of which may raise a chord flag.
import { bestMotion, MAX_GRADED_PITCHES } from "./bestMotion";
import { isRootPositionLeap, isTopLineLeap } from "./changeFlags";
import { raisesNoChordFlag } from "./chordFlags";
import type { Key } from "./pitch";
import { noteName } from "./pitch";
import type { ChangeFlag, ChangeReport, ChordReport, Suggestion } from "./types";
import { motion, voiceLeadingPairs } from "./voiceLeading";

const sameVoicing = (x: number[], y: number[]) => x.length === y.length && x.every((n, i) => n === y[i]);

function suggestions(a: number[], b: number[], key: Key | null): Suggestion[] {
  const kinds: Array<[Suggestion["kind"], { keepTop?: boolean; keepBass?: boolean }]> = [
    ["smoothest", {}],
    ["keep-top", { keepTop: true }],
    ["keep-bass", { keepBass: true }],
  ];
  const out: Suggestion[] = [];
  for (const [kind, opts] of kinds) {
    const found = bestMotion(a, b, { ...opts, accept: raisesNoChordFlag });
    if (!found) continue;
    // Nothing to suggest when it is what was played, or when an earlier suggestion says it.
    if (sameVoicing(found.voicing, b) || out.some((s) => sameVoicing(s.voicing, found.voicing))) continue;
    out.push({ kind, voicing: found.voicing, noteNames: found.voicing.map((n) => noteName(n, key)), motion: found.motion });
  }
  return out;
}

export function gradeChange(from: number, to: number, a: ChordReport, b: ChordReport, key: Key | null): ChangeReport {
  const va = a.notes;
  const vb = b.notes;
  const flags: ChangeFlag[] = [];
  const base = {
    from,
    to,
    bassMotion: vb[0] - va[0],
    topVoiceInterval: vb[vb.length - 1] - va[va.length - 1],
    blurredNotes: [] as number[],
  };
  if (va.length > MAX_GRADED_PITCHES || vb.length > MAX_GRADED_PITCHES) {
    // Rule 8: chords of more than 8 distinct pitches are not graded.
    return {
      ...base,
      graded: false,
      motion: null,
      bestMotion: null,
      bestVoicing: null,
      suggestions: [],
      commonTones: va.filter((n) => vb.includes(n)).length,
      largestVoiceMove: null,
      flags,
    };
  }
  const played = motion(va, vb);
  const best = bestMotion(va, vb);
  const pairs = voiceLeadingPairs(va, vb);
  if (isRootPositionLeap(va, vb, a.inversion, b.inversion)) flags.push("root-position-leap");
  if (isTopLineLeap(va, vb)) flags.push("top-line-leap");
  return {
    ...base,
    graded: true,
    motion: played,
    // B itself is always a candidate, so this never exceeds the played motion (rule 8).
    bestMotion: best ? best.motion : played,
    bestVoicing: best ? best.voicing : vb,
    suggestions: suggestions(va, vb, key),
    commonTones: pairs.filter(([x, y]) => x === y).length,
    largestVoiceMove: pairs.reduce((m, [x, y]) => Math.max(m, Math.abs(y - x)), 0),
    flags,
  };
}

export function gradeChanges(chords: ChordReport[], key: Key | null): ChangeReport[] {
  // Takes loop their progressions, so the same change recurs: grade each distinct one once.
  // Everything but the indices depends only on the two voicings (and the take's key).
  const seen = new Map<string, ChangeReport>();
  const out: ChangeReport[] = [];
  for (let i = 1; i < chords.length; i++) {
    const id = `${chords[i - 1].notes.join(",")}>${chords[i].notes.join(",")}`;
    const known = seen.get(id);
    if (known) {
      out.push({ ...known, from: i - 1, to: i });
      continue;
    }
    const graded = gradeChange(i - 1, i, chords[i - 1], chords[i], key);
    seen.set(id, graded);
    out.push(graded);
  }
  return out;
}
