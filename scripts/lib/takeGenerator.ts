// Invented demo takes for the Tidewater Keys studio: the four exercises of the demo scenario,
// each with a smooth plan (what the teacher hopes for) and a clumsy plan (what a beginner
// tends to play), rendered with human timing by a seeded random generator. Used by
// `npm run samples`, the seed script (twelve weeks of improving takes) and `npm run bench`.
import tonejsMidi from "@tonejs/midi";

const { Midi } = tonejsMidi;

/** One chord as planned: left hand (may be empty), right hand, optional grace note into the right hand. */
export type PlannedChord = { lh: number[]; rh: number[]; grace?: { from: number; to: number } };

export type Exercise = {
  id: string;
  title: string;
  key: string;
  target: string;
  bpm: number;
  smooth: PlannedChord[];
  clumsy: PlannedChord[];
};

// MIDI numbers: C4 = 60. Voicings chosen by hand for each plan.
export const EXERCISES: Exercise[] = [
  {
    id: "three-chord-smoothing-d",
    title: "Three-chord smoothing in D",
    key: "D",
    target: "I IV V I",
    bpm: 80,
    // Inversions keep the right hand near D4–A4; left hand plays roots.
    smooth: [
      { lh: [50], rh: [62, 66, 69] },
      { lh: [43], rh: [62, 67, 71] },
      { lh: [45], rh: [61, 64, 69] },
      { lh: [50], rh: [62, 66, 69] },
    ],
    // Root position everywhere: the whole hand jumps.
    clumsy: [
      { lh: [], rh: [62, 66, 69] },
      { lh: [], rh: [67, 71, 74] },
      { lh: [], rh: [69, 73, 76] },
      { lh: [], rh: [62, 66, 69] },
    ],
  },
  {
    id: "sunday-ballad-ab",
    title: "Sunday ballad in A♭",
    key: "Ab",
    target: "vi IV I V",
    bpm: 66,
    // Open voicings: the close triad's middle note dropped an octave.
    smooth: [
      { lh: [41], rh: [53, 60, 68] },
      { lh: [37], rh: [53, 61, 68] },
      { lh: [44], rh: [51, 60, 68] },
      { lh: [39], rh: [51, 58, 67] },
    ],
    clumsy: [
      { lh: [], rh: [53, 56, 60] },
      { lh: [], rh: [49, 53, 56] },
      { lh: [], rh: [56, 60, 63] },
      { lh: [], rh: [51, 55, 58] },
    ],
  },
  {
    id: "minor-colour-g",
    title: "Minor colour in G minor",
    key: "Gm",
    target: "iiø7 V7 i",
    bpm: 72,
    // The added 9th on i arrives as a grace note A3 rising to the 3rd, B♭3.
    smooth: [
      { lh: [45], rh: [60, 63, 67] },
      { lh: [50], rh: [60, 66, 69] },
      { lh: [43], rh: [58, 62, 69], grace: { from: 57, to: 58 } },
    ],
    clumsy: [
      { lh: [], rh: [57, 60, 63, 67] },
      { lh: [], rh: [62, 66, 69, 72] },
      { lh: [], rh: [55, 58, 62] },
    ],
  },
  {
    id: "falling-bass-eb",
    title: "Falling bass in E♭",
    key: "Eb",
    target: "Eb Bb/D Cm Cm/Bb Ab",
    bpm: 76,
    smooth: [
      { lh: [39], rh: [55, 58, 63] },
      { lh: [38], rh: [53, 58, 65] },
      { lh: [36], rh: [55, 60, 63] },
      { lh: [34], rh: [55, 60, 63] },
      { lh: [32], rh: [56, 60, 63] },
    ],
    // The 3rd of B♭ doubled over its own bass; a muddy low third under A♭.
    clumsy: [
      { lh: [39], rh: [55, 58, 63] },
      { lh: [38], rh: [58, 62, 65] },
      { lh: [36], rh: [55, 60, 63] },
      { lh: [34], rh: [55, 60, 63] },
      { lh: [44, 48], rh: [56, 60, 63] },
    ],
  },
];

/** mulberry32: a small seeded generator, so every sample and seed take is reproducible. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export type HumanTiming = {
  bpm: number;
  /** beats per chord */
  beats?: number;
  /** standard deviation of onset wobble, seconds */
  jitter?: number;
  /** delay between successive notes of a rolled right hand, seconds (0 = together) */
  roll?: number;
  /** left hand this many seconds after the right (negative: before) */
  bassOffset?: number;
  /** left hand holds its note across this many chords (1 = re-struck every chord) */
  holdBassFor?: number;
  pedal?: boolean;
  /** left and right hands on separate tracks and channels */
  twoTracks?: boolean;
  /** velocity spread around 0.7 */
  velocitySpread?: number;
  seed?: number;
};

type Placed = { midi: number; time: number; duration: number; velocity: number; hand: "lh" | "rh" };

function gaussian(rand: () => number): number {
  return Math.sqrt(-2 * Math.log(Math.max(rand(), 1e-9))) * Math.cos(2 * Math.PI * rand());
}

/** Lays out planned chords in time with human imperfections; returns notes and pedal spans. */
export function performChords(plan: PlannedChord[], timing: HumanTiming) {
  const rand = seededRandom(timing.seed ?? 1);
  const beat = 60 / timing.bpm;
  const slot = beat * (timing.beats ?? 2);
  const notes: Placed[] = [];
  const pedal: Array<{ on: number; off: number }> = [];
  const vel = () => Math.min(1, Math.max(0.2, 0.7 + (timing.velocitySpread ?? 0.1) * gaussian(rand)));
  const hold = Math.max(1, timing.holdBassFor ?? 1);
  plan.forEach((chord, i) => {
    const t0 = 0.5 + i * slot + (timing.jitter ?? 0) * gaussian(rand);
    const release = slot * 0.92;
    let t = t0;
    if (chord.grace) {
      // A quick grace note ending as the note it resolves to begins.
      notes.push({ midi: chord.grace.from, time: t0, duration: 0.09, velocity: vel(), hand: "rh" });
    }
    chord.rh.forEach((midi) => {
      const start = chord.grace && midi === chord.grace.to ? t0 + 0.09 : t;
      notes.push({ midi, time: start, duration: Math.max(0.2, release - (start - t0)), velocity: vel(), hand: "rh" });
      t += timing.roll ?? 0;
    });
    if (i % hold === 0) {
      const lhStart = Math.max(0, t0 + (timing.bassOffset ?? 0));
      for (const midi of chord.lh) {
        notes.push({ midi, time: lhStart, duration: slot * hold * 0.97, velocity: vel(), hand: "lh" });
      }
    }
    if (timing.pedal) pedal.push({ on: t0 + 0.12, off: t0 + slot - 0.05 });
  });
  return { notes, pedal };
}

/** Writes performed notes as a Standard MIDI File with @tonejs/midi. */
export function writeTake(performed: ReturnType<typeof performChords>, timing: HumanTiming, name: string): Uint8Array {
  const midi = new Midi();
  midi.header.setTempo(timing.bpm);
  midi.header.name = name;
  const right = midi.addTrack();
  right.name = "Right hand";
  right.channel = 0;
  const left = timing.twoTracks ? midi.addTrack() : right;
  if (timing.twoTracks) {
    left.name = "Left hand";
    left.channel = 1;
  }
  for (const n of performed.notes) {
    (n.hand === "lh" ? left : right).addNote({
      midi: n.midi,
      time: n.time,
      duration: n.duration,
      velocity: n.velocity,
    });
  }
  for (const p of performed.pedal) {
    right.addCC({ number: 64, value: 1, time: p.on });
    right.addCC({ number: 64, value: 0, time: p.off });
  }
  return midi.toArray();
}

export type TakeRequest = {
  exercise: Exercise;
  /** 0 = beginner (clumsy voicings, loose timing, slips), 1 = polished */
  skill: number;
  seed: number;
  /** times through the progression */
  loops?: number;
};

/**
 * A take of an exercise at a skill level: each chord follows the smooth plan with a
 * probability that grows with skill, timing tightens, and wrong or skipped chords get rarer.
 */
export function generateTake(req: TakeRequest): Uint8Array {
  const rand = seededRandom(req.seed * 7919 + 17);
  const skill = Math.min(1, Math.max(0, req.skill));
  const plan: PlannedChord[] = [];
  for (let loop = 0; loop < (req.loops ?? 2); loop++) {
    req.exercise.smooth.forEach((good, i) => {
      if (rand() < (1 - skill) * 0.08) return; // a skipped chord
      const chosen = rand() < 0.15 + 0.85 * skill ? good : req.exercise.clumsy[i];
      // A wrong chord now and then: the right hand a whole step off.
      if (rand() < (1 - skill) * 0.1) plan.push({ lh: chosen.lh, rh: chosen.rh.map((n) => n + 2) });
      else plan.push(chosen);
    });
  }
  const timing: HumanTiming = {
    bpm: req.exercise.bpm,
    jitter: 0.01 + (1 - skill) * 0.06,
    roll: rand() < 0.3 ? 0.02 : 0,
    velocitySpread: 0.05 + (1 - skill) * 0.12,
    pedal: skill > 0.5,
    twoTracks: true,
    seed: req.seed,
  };
  return writeTake(performChords(plan, timing), timing, `${req.exercise.title} (demo)`);
}

/**
 * About ten minutes of four-note chords with human timing (roughly 5,000 notes), for the
 * benchmark: the D exercise's smooth plan transposed through several keys.
 */
export function generateLongTake(minutes = 10, seed = 42): Uint8Array {
  const bpm = 125;
  const slotBeats = 1;
  const chordsNeeded = Math.round((minutes * 60 * bpm) / 60 / slotBeats);
  const base = EXERCISES[0].smooth;
  const plan: PlannedChord[] = [];
  for (let i = 0; i < chordsNeeded; i++) {
    const shift = [0, 5, -2, 3][Math.floor(i / 16) % 4];
    const c = base[i % base.length];
    plan.push({ lh: c.lh.map((n) => n + shift), rh: c.rh.map((n) => n + shift) });
  }
  const timing: HumanTiming = {
    bpm,
    beats: slotBeats,
    jitter: 0.015,
    roll: 0.012,
    velocitySpread: 0.12,
    twoTracks: true,
    pedal: true,
    seed,
  };
  return writeTake(performChords(plan, timing), timing, "Benchmark take");
}
