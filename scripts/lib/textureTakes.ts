// Takes played the ordinary ways students play (a pedalled ballad bass, broken chords, a
// walking bass, a tune over held chords, shells, rootless voicings, ...), written by hand
// note by note in beats and then played with human timing by a seeded generator: onsets
// wobble by about a hundredth of a second, velocities vary, keys are let go a little early.
// Each take states what a teacher hears in it (harmony count, chord names, basses, flags);
// tests/unit/analysis/textures.test.ts checks the engine hears the same. The names were
// worked out by hand from app/analysis/RULES.md, not read back from the engine.
import type { FlagName } from "../../app/analysis/types";
import { seededRandom } from "./takeGenerator";
import tonejsMidi from "@tonejs/midi";

const { Midi } = tonejsMidi;

/** A note in beats: onset, length, hand. */
export type BeatNote = { midi: number; at: number; len: number; hand: "lh" | "rh" };

export type TextureTake = {
  file: string;
  about: string;
  key: string;
  target?: string;
  bpm: number;
  notes: BeatNote[];
  /** sustain pedal down and up, in beats */
  pedal?: Array<[number, number]>;
  /** tempo wobble: each beat lasts up to this share longer or shorter (a slow wave) */
  rubato?: number;
  seed: number;
  expect: {
    /** chord symbols in order, one per harmony, spelled in the key */
    symbols: string[];
    /** bass of each harmony (pitch name without octave) */
    basses?: string[];
    /** change flags expected somewhere in the take (others must be absent) */
    changeFlags?: FlagName[];
    /** at least one harmony has a bass line */
    bassLine?: boolean;
    /** the take has a melody */
    melody?: boolean;
    /** kinds of non-chord tone that must appear */
    nonChordTones?: Array<"passing" | "neighbour" | "grace" | "suspension" | "anticipation">;
    accuracy?: number;
    techniques?: string[];
    /** techniques that must not be credited */
    notTechniques?: string[];
  };
};

const chord = (at: number, len: number, midis: number[], hand: "lh" | "rh" = "rh"): BeatNote[] =>
  midis.map((midi) => ({ midi, at, len, hand }));
const line = (at: number, items: Array<[number, number]>, hand: "lh" | "rh" = "rh"): BeatNote[] => {
  const out: BeatNote[] = [];
  let t = at;
  for (const [midi, len] of items) {
    out.push({ midi, at: t, len, hand });
    t += len;
  }
  return out;
};
const bars = <T>(n: number, per: (bar: number) => T[]): T[] => Array.from({ length: n }, (_, i) => per(i)).flat();

// MIDI numbers: C4 = 60.
const C2 = 36,
  D2 = 38,
  E2 = 40,
  F2 = 41,
  G2 = 43,
  A2 = 45,
  B2 = 47;
const C3 = 48,
  D3 = 50,
  E3 = 52,
  F3 = 53,
  G3 = 55,
  A3 = 57,
  B3 = 59;
const C4 = 60,
  D4 = 62,
  E4 = 64,
  F4 = 65,
  G4 = 67,
  A4 = 69,
  B4 = 71;
const C5 = 72,
  D5 = 74,
  E5 = 76,
  F5 = 77,
  G5 = 79;

/** F7 B♭7 F7 C7: a walking bass in quarters, by bar (shared by the two walking-bass takes). */
const WALKING_BASS = [
  [F2, G2, A2, C3],
  [B2 - 1, A2 - 1, G2, G2 - 1],
  [F2, A2, C3, E3],
  [C3, B2 - 1, A2, G2],
];

export const TEXTURE_TAKES: TextureTake[] = [
  {
    file: "texture-pedalled-ballad-ab.mid",
    about:
      "vi IV I V in A♭: a left-hand octave struck and let go under the pedal, the right hand re-striking its chord on every beat",
    key: "Ab",
    target: "vi IV I V",
    bpm: 66,
    seed: 101,
    notes: bars(4, (b) => {
      const [lo, rh] = [
        [F2, [A3 - 1, C4, F4]],
        [D2 - 1, [A3 - 1, D4 - 1, F4]],
        [A2 - 1 - 12, [A3 - 1, C4, E4 - 1]],
        [E2 - 1, [G3, B3 - 1, E4 - 1]],
      ][b] as [number, number[]];
      return [...chord(b * 4, 0.9, [lo, lo + 12], "lh"), ...[0, 1, 2, 3].flatMap((k) => chord(b * 4 + k, 0.8, rh))];
    }),
    pedal: [0, 1, 2, 3].map((b) => [b * 4 + 0.15, b * 4 + 3.9] as [number, number]),
    expect: {
      symbols: ["Fm", "Db", "Ab", "Eb"],
      basses: ["F", "Db", "Ab", "Eb"],
      accuracy: 1,
      notTechniques: ["slash-bass"],
    },
  },
  {
    file: "texture-broken-chords-d.mid",
    about: "I vi IV V in D: left-hand 1-5-8-10 patterns in eighths under the pedal, right-hand chords on beats 1 and 3",
    key: "D",
    target: "I vi IV V",
    bpm: 100,
    seed: 102,
    notes: bars(4, (b) => {
      const [root, rh] = [
        [D2, [A3, D4, F4 + 1]],
        [B2 - 12, [B3, D4, F4 + 1]],
        [G2 - 12, [B3, D4, G4]],
        [A2 - 12, [A3, C4 + 1, E4]],
      ][b] as [number, number[]];
      const third = [4, 3, 4, 4][b];
      const pattern = [root, root + 7, root + 12, root + 12 + third];
      return [
        ...[0, 2].flatMap((half) =>
          pattern.map((m, k) => ({ midi: m, at: b * 4 + half + k * 0.5, len: 0.45, hand: "lh" as const })),
        ),
        ...chord(b * 4, 1.8, rh),
        ...chord(b * 4 + 2, 1.8, rh),
      ];
    }),
    pedal: [0, 1, 2, 3].map((b) => [b * 4 + 0.15, b * 4 + 3.9] as [number, number]),
    expect: {
      symbols: ["D", "Bm", "G", "A"],
      basses: ["D", "B", "G", "A"],
      accuracy: 1,
      notTechniques: ["slash-bass"],
    },
  },
  {
    file: "texture-arpeggios-c.mid",
    about: "I vi IV V in C: the left hand holds the root, the right hand runs up and down the chord in eighths",
    key: "C",
    target: "I vi IV V",
    bpm: 84,
    seed: 103,
    notes: bars(4, (b) => {
      const root = [C3, A2, F2, G2][b];
      // Inversions keep the hand near C4–C5 (no block leaps between the patterns).
      const up = [
        [C4, E4, G4, C5],
        [C4, E4, A4, C5],
        [C4, F4, A4, C5],
        [B3, D4, G4, B4],
      ][b];
      const run = [...up, up[2], up[1], up[0], up[1]];
      return [
        ...chord(b * 4, 3.9, [root], "lh"),
        ...run.map((m, k) => ({ midi: m, at: b * 4 + k * 0.5, len: 0.45, hand: "rh" as const })),
      ];
    }),
    expect: { symbols: ["C", "Am", "F", "G"], basses: ["C", "A", "F", "G"], accuracy: 1, melody: false },
  },
  {
    file: "texture-walking-bass-held-f.mid",
    about: "F7 B♭7 F7 C7: a walking bass in quarters under right-hand shells held through each bar",
    key: "F",
    target: "I7 IV7 I7 V7",
    bpm: 120,
    seed: 104,
    notes: bars(4, (b) => {
      const walk = WALKING_BASS[b];
      const shell = [
        [A3, E4 - 1],
        [A3 - 1, D4],
        [A3, E4 - 1],
        [B3 - 1, E4],
      ][b];
      return [
        ...chord(b * 4, 3.9, shell),
        ...walk.map((m, k) => ({ midi: m, at: b * 4 + k, len: 0.95, hand: "lh" as const })),
      ];
    }),
    expect: {
      symbols: ["F7", "Bb7", "F7", "C7"],
      basses: ["F", "Bb", "F", "C"],
      bassLine: true,
      accuracy: 1,
      notTechniques: ["slash-bass"],
    },
  },
  {
    file: "texture-walking-bass-comping-f.mid",
    about: "The same walking bass with short right-hand stabs, some on the beat with a bass note, some off it",
    key: "F",
    target: "I7 IV7 I7 V7",
    bpm: 120,
    seed: 105,
    notes: bars(4, (b) => {
      const walk = WALKING_BASS[b];
      const comp = [
        [A3, C4, E4 - 1],
        [A3 - 1, D4, F4],
        [A3, C4, E4 - 1],
        [B3 - 1, E4, G4],
      ][b];
      const second = b % 2 === 0 ? 2.5 : 2;
      return [
        ...chord(b * 4, 0.4, comp),
        ...chord(b * 4 + second, 0.4, comp),
        ...walk.map((m, k) => ({ midi: m, at: b * 4 + k, len: 0.9, hand: "lh" as const })),
      ];
    }),
    expect: {
      symbols: ["F7", "Bb7", "F7", "C7"],
      basses: ["F", "Bb", "F", "C"],
      bassLine: true,
      accuracy: 1,
      notTechniques: ["slash-bass"],
    },
  },
  {
    file: "texture-melody-over-chords-c.mid",
    about: "I vi IV V in C: left-hand chords held a bar each under a tune with passing and neighbour notes",
    key: "C",
    target: "I vi IV V",
    bpm: 90,
    seed: 106,
    notes: [
      ...chord(0, 3.9, [C3, G3, E4], "lh"),
      ...chord(4, 3.9, [A2, E3, C4], "lh"),
      ...chord(8, 3.9, [F2, C3, A3], "lh"),
      ...chord(12, 3.9, [G2, D3, B3], "lh"),
      ...line(0, [
        [E5, 1],
        [D5, 0.5],
        [C5, 1.5],
        [B4, 0.5],
        [C5, 0.5],
      ]),
      ...line(4, [
        [C5, 1],
        [D5, 0.5],
        [C5, 1],
        [B4, 0.5],
        [A4, 1],
      ]),
      ...line(8, [
        [A4, 1],
        [G4, 0.5],
        [F4, 1.5],
        [A4, 1],
      ]),
      ...line(12, [
        [D5, 1],
        [C5, 0.5],
        [B4, 2.5],
      ]),
    ],
    expect: {
      symbols: ["C", "Am", "F", "G"],
      basses: ["C", "A", "F", "G"],
      melody: true,
      nonChordTones: ["passing", "neighbour"],
      accuracy: 1,
    },
  },
  {
    file: "texture-shells-melody-bb.mid",
    about: "ii7 V7 Imaj7 in B♭: left-hand shells (root, 7th, 3rd) under a right-hand tune",
    key: "Bb",
    target: "ii7 V7 Imaj7",
    bpm: 96,
    seed: 107,
    notes: [
      ...chord(0, 3.9, [C3, B3 - 1, E4 - 1], "lh"),
      ...chord(4, 3.9, [F2, E3 - 1, A3], "lh"),
      ...chord(8, 7.9, [B2 - 1, A3, D4], "lh"),
      ...line(0, [
        [G5, 1],
        [F5, 0.5],
        [E5 - 1, 1.5],
        [D5, 1],
      ]),
      ...line(4, [
        [C5, 1.5],
        [B4 - 1, 0.5],
        [A4, 2],
      ]),
      ...line(8, [
        [B4 - 1, 2],
        [C5, 1],
        [D5, 5],
      ]),
    ],
    expect: {
      symbols: ["Cm7", "F7", "Bbmaj7"],
      basses: ["C", "F", "Bb"],
      melody: true,
      nonChordTones: ["passing"],
      accuracy: 1,
    },
  },
  {
    file: "texture-rootless-ii-v-i-c.mid",
    about: "ii7 V7 Imaj7 in C with rootless left-hand voicings (3-5-7-9, 7-9-3-13, 3-5-7-9) and no bass, twice",
    key: "C",
    target: "ii7 V7 Imaj7",
    bpm: 100,
    seed: 108,
    notes: bars(2, (r) => [
      ...chord(r * 12, 3.9, [F3, A3, C4, E4]),
      ...chord(r * 12 + 4, 3.9, [F3, A3, B3, E4]),
      ...chord(r * 12 + 8, 3.9, [E3, G3, B3, D4]),
    ]),
    expect: { symbols: ["Dm9", "G13", "Cmaj9", "Dm9", "G13", "Cmaj9"], melody: false, accuracy: 1 },
  },
  {
    file: "texture-rootless-ii-v-i-bass-c.mid",
    about: "The same rootless voicings over a left-hand root",
    key: "C",
    target: "ii7 V7 Imaj7",
    bpm: 100,
    seed: 109,
    notes: bars(2, (r) => [
      ...chord(r * 12, 3.9, [D2], "lh"),
      ...chord(r * 12, 3.9, [F3, A3, C4, E4]),
      ...chord(r * 12 + 4, 3.9, [G2], "lh"),
      ...chord(r * 12 + 4, 3.9, [F3, A3, B3, E4]),
      ...chord(r * 12 + 8, 3.9, [C2], "lh"),
      ...chord(r * 12 + 8, 3.9, [E3, G3, B3, D4]),
    ]),
    expect: {
      symbols: ["Dm9", "G13", "Cmaj9", "Dm9", "G13", "Cmaj9"],
      basses: ["D", "G", "C", "D", "G", "C"],
      accuracy: 1,
    },
  },
  {
    file: "texture-moving-finger-g.mid",
    about: "G, Em/G, C/G, G: the hand holds its common tones and moves one or two fingers",
    key: "G",
    bpm: 80,
    seed: 110,
    notes: [
      { midi: G3, at: 0, len: 7.9, hand: "rh" },
      { midi: B3, at: 0, len: 3.9, hand: "rh" },
      { midi: D4, at: 0, len: 1.9, hand: "rh" },
      { midi: E4, at: 2, len: 3.9, hand: "rh" },
      { midi: C4, at: 4, len: 1.9, hand: "rh" },
      { midi: B3, at: 6, len: 1.9, hand: "rh" },
      { midi: D4, at: 6, len: 1.9, hand: "rh" },
    ],
    expect: { symbols: ["G", "Em/G", "C/G", "G"], basses: ["G", "G", "G", "G"] },
  },
  {
    file: "texture-pedal-held-c.mid",
    about: "I ii IV V in C with the pedal held through the first change, then changed with each chord",
    key: "C",
    bpm: 80,
    seed: 111,
    notes: [
      ...chord(0, 1.9, [C3, E4, G4, C5]),
      ...chord(2, 1.9, [D3, F4, A4, D5]),
      ...chord(4, 1.9, [F3, F4, A4, C5]),
      ...chord(6, 1.9, [G3, D4, G4, B4]),
    ],
    pedal: [
      [0.15, 3.9],
      [4.15, 5.9],
      [6.15, 7.9],
    ],
    expect: { symbols: ["C", "Dm", "F", "G"], basses: ["C", "D", "F", "G"], changeFlags: ["pedal-blur"] },
  },
  {
    file: "texture-grace-notes-f.mid",
    about: "F, B♭, C, F with a crushed grace note from the added 2nd into the 3rd of each chord",
    key: "F",
    bpm: 72,
    seed: 112,
    notes: [
      ...[
        [F3, [A3, C4], G3 + 1],
        [B2 - 1, [D4, F4], C4 + 1],
        [C3, [E4, G4], D4 + 1],
        [F3, [A3, C4], G3 + 1],
      ].flatMap(([bass, rh, grace], k) => {
        const [third, fifth] = rh as number[];
        return [
          { midi: bass as number, at: k * 2, len: 1.9, hand: "lh" as const },
          { midi: grace as number, at: k * 2, len: 0.15, hand: "rh" as const },
          { midi: third, at: k * 2 + 0.1, len: 1.8, hand: "rh" as const },
          { midi: fifth, at: k * 2, len: 1.9, hand: "rh" as const },
        ];
      }),
    ],
    expect: {
      symbols: ["F", "Bb", "C", "F"],
      basses: ["F", "Bb", "C", "F"],
      nonChordTones: ["grace"],
      techniques: ["grace-to-third"],
    },
  },
  {
    file: "texture-altered-sevenths-c.mid",
    about: "Sevenths and altered chords in C minor and major: Dm7♭5, G7♭9, Cm7, B°7, E7♯9, A13",
    key: "C",
    bpm: 80,
    seed: 113,
    notes: [
      ...chord(0, 1.9, [D3, A3 - 1, C4, F4]),
      ...chord(2, 1.9, [G2, F3, B3, A4 - 1]),
      ...chord(4, 1.9, [C3, B3 - 1, E4 - 1, G4]),
      ...chord(6, 1.9, [B3, D4, F4, A4 - 1]),
      ...chord(8, 1.9, [E2, D3, G3 + 1, G4]),
      ...chord(10, 1.9, [A2, G3, C4 + 1, F4 + 1]),
    ],
    expect: { symbols: ["Dm7b5", "G7b9", "Cm7", "Bdim7", "E7#9", "A13"], basses: ["D", "G", "C", "B", "E", "A"] },
  },
  {
    file: "texture-waltz-rubato-g.mid",
    about: "A waltz in G with rubato: bass on the first beat, the chord on the second and third",
    key: "G",
    target: "I IV V7 I",
    bpm: 108,
    rubato: 0.12,
    seed: 114,
    notes: bars(4, (b) => {
      const [bass, rh] = [
        [G2, [B3, D4, G4]],
        [C3, [C4, E4, G4]],
        [D3, [C4, F4 + 1, A4]],
        [G2, [B3, D4, G4]],
      ][b] as [number, number[]];
      return [
        { midi: bass, at: b * 3, len: 0.95, hand: "lh" as const },
        ...chord(b * 3 + 1, 0.9, rh),
        ...chord(b * 3 + 2, 0.9, rh),
      ];
    }),
    pedal: [0, 1, 2, 3].map((b) => [b * 3 + 0.1, b * 3 + 2.9] as [number, number]),
    expect: { symbols: ["G", "C", "D7", "G"], basses: ["G", "C", "D", "G"], accuracy: 1 },
  },
];

function gaussian(rand: () => number): number {
  return Math.sqrt(-2 * Math.log(Math.max(rand(), 1e-9))) * Math.cos(2 * Math.PI * rand());
}

/** Plays a texture take with human timing; returns notes and pedal in seconds. */
export function performTexture(t: TextureTake) {
  const rand = seededRandom(t.seed);
  const beat = 60 / t.bpm;
  // One beat of lead-in keeps the take on its tempo map's grid, as a recording to a metronome is.
  const lead = beat;
  // Rubato: beat lengths follow a slow wave, so the time of beat x is an integral.
  const timeOf = (x: number) => {
    if (!t.rubato) return lead + x * beat;
    const r = t.rubato;
    return lead + beat * (x + (r * 4 * (1 - Math.cos((Math.PI * x) / 4))) / Math.PI);
  };
  const groupJitter = new Map<string, number>();
  const onset = (n: BeatNote) => {
    // Notes within one half-beat of a hand share their timing wobble (a grace note and its resolution too).
    const id = `${n.hand}:${Math.floor(n.at * 2 + 1e-9)}`;
    if (!groupJitter.has(id)) groupJitter.set(id, 0.012 * gaussian(rand));
    return Math.max(0, timeOf(n.at) + groupJitter.get(id)! + 0.004 * gaussian(rand));
  };
  const notes = t.notes.map((n) => {
    const start = onset(n);
    const end = timeOf(n.at + n.len) - 0.02;
    return {
      midi: n.midi,
      time: start,
      duration: Math.max(0.05, end - start),
      velocity: Math.min(1, Math.max(0.25, 0.65 + 0.08 * gaussian(rand))),
      hand: n.hand,
    };
  });
  const pedal = (t.pedal ?? []).map(([on, off]) => ({ on: timeOf(on), off: timeOf(off) }));
  return { notes, pedal };
}

/** Writes a texture take as a Standard MIDI File (two tracks, one per hand) with @tonejs/midi. */
export function writeTexture(t: TextureTake): Uint8Array {
  const played = performTexture(t);
  const midi = new Midi();
  midi.header.setTempo(t.bpm);
  midi.header.name = t.about;
  const right = midi.addTrack();
  right.name = "Right hand";
  right.channel = 0;
  const left = midi.addTrack();
  left.name = "Left hand";
  left.channel = 1;
  for (const n of played.notes)
    (n.hand === "lh" ? left : right).addNote({
      midi: n.midi,
      time: n.time,
      duration: n.duration,
      velocity: n.velocity,
    });
  for (const p of played.pedal) {
    right.addCC({ number: 64, value: 1, time: p.on });
    right.addCC({ number: 64, value: 0, time: p.off });
  }
  return midi.toArray();
}

/**
 * About ten minutes of a realistic texture for the benchmark: left-hand broken chords in
 * eighths under the pedal, changed each bar, and a right-hand tune in quarters and eighths
 * with passing notes, through I vi IV V in four keys.
 */
export function longTextureTake(minutes = 10, seed = 43): TextureTake {
  const bpm = 100;
  const barsNeeded = Math.round((minutes * 60 * bpm) / 60 / 4);
  const notes: BeatNote[] = [];
  const pedal: Array<[number, number]> = [];
  const roots = [0, 9, 5, 7]; // I vi IV V
  const thirds = [4, 3, 4, 4];
  for (let bar = 0; bar < barsNeeded; bar++) {
    const key = [0, 5, -2, 3][Math.floor(bar / 16) % 4];
    const k = bar % 4;
    const root = 36 + ((roots[k] + key + 12) % 12);
    const pattern = [root, root + 7, root + 12, root + 12 + thirds[k]];
    for (let half = 0; half < 2; half++) {
      pattern.forEach((m, q) => notes.push({ midi: m, at: bar * 4 + half * 2 + q * 0.5, len: 0.45, hand: "lh" }));
    }
    // The tune: chord tones on the beat, a passing note between the third and the fifth.
    const third = root + 24 + thirds[k];
    const fifth = root + 31;
    notes.push(
      { midi: fifth, at: bar * 4, len: 1, hand: "rh" },
      { midi: third + 1 + (thirds[k] === 3 ? 1 : 0), at: bar * 4 + 1, len: 0.5, hand: "rh" },
      { midi: third, at: bar * 4 + 1.5, len: 1.5, hand: "rh" },
      { midi: root + 24, at: bar * 4 + 3, len: 1, hand: "rh" },
    );
    pedal.push([bar * 4 + 0.15, bar * 4 + 3.9]);
  }
  return {
    file: "benchmark-texture.mid",
    about: "Ten minutes of pedalled broken chords under a tune",
    key: "C",
    bpm,
    seed,
    notes,
    pedal,
    expect: { symbols: [] },
  };
}
