// The demo takes `npm run samples` writes into samples/. Each lists what it is meant to show,
// and a test analyses every file and checks exactly that, so the samples cannot drift.
import type { FlagName, TechniqueName } from "../../app/analysis/types";
import { EXERCISES, performChords, writeTake, type HumanTiming, type PlannedChord } from "./takeGenerator";

export type SampleTake = {
  file: string;
  about: string;
  key: string;
  target?: string;
  shows: {
    techniques?: TechniqueName[];
    flags?: FlagName[];
    heldNotes?: boolean;
    graceNotes?: boolean;
    /** accuracy against `target` */
    accuracy?: number;
  };
  build: () => Uint8Array;
};

const exercise = (id: string) => EXERCISES.find((e) => e.id === id)!;
const twice = (plan: PlannedChord[]) => [...plan, ...plan];

function render(plan: PlannedChord[], timing: HumanTiming, name: string): Uint8Array {
  return writeTake(performChords(plan, timing), timing, name);
}

export const SAMPLE_TAKES: SampleTake[] = [
  {
    file: "three-chord-smoothing-d.mid",
    about: "Dara's I IV V I in D: inversions in the right hand, rolled chords, uneven velocity, two tracks",
    key: "D",
    target: "I IV V I",
    shows: { techniques: ["inversion", "smooth-top-line"], accuracy: 1 },
    build: () =>
      render(
        twice(exercise("three-chord-smoothing-d").smooth),
        { bpm: 80, roll: 0.025, velocitySpread: 0.15, jitter: 0.01, twoTracks: true, seed: 11 },
        "Three-chord smoothing in D",
      ),
  },
  {
    file: "sunday-ballad-ab.mid",
    about: "Felix's vi IV I V in Ab one and a half times, open voicings, sustain pedal, the left hand 100 ms late",
    key: "Ab",
    target: "vi IV I V",
    shows: { techniques: ["open-voicing"], accuracy: 0.75 },
    build: () =>
      render(
        [...exercise("sunday-ballad-ab").smooth, ...exercise("sunday-ballad-ab").smooth.slice(0, 2)],
        { bpm: 66, pedal: true, bassOffset: 0.1, velocitySpread: 0.1, jitter: 0.008, twoTracks: true, seed: 12 },
        "Sunday ballad in Ab",
      ),
  },
  {
    file: "minor-colour-g.mid",
    about: "Yuki's iiø7 V7 i in G minor: an added 9th on i as a grace note rising to the 3rd, the bass a little early",
    key: "Gm",
    target: "iiø7 V7 i",
    shows: { techniques: ["added-second", "grace-to-third", "open-voicing"], graceNotes: true, accuracy: 1 },
    build: () =>
      render(
        twice(exercise("minor-colour-g").smooth),
        { bpm: 72, bassOffset: -0.12, jitter: 0.01, twoTracks: true, seed: 13 },
        "Minor colour in G minor",
      ),
  },
  {
    file: "falling-bass-eb.mid",
    about: "Samir's falling bass in Eb: slash chords over a left-hand line, one track",
    key: "Eb",
    target: "Eb Bb/D Cm Cm/Bb Ab",
    shows: { techniques: ["slash-bass", "inversion"], accuracy: 1 },
    build: () =>
      render(
        exercise("falling-bass-eb").smooth,
        { bpm: 76, jitter: 0.01, velocitySpread: 0.12, seed: 14 },
        "Falling bass in Eb",
      ),
  },
  {
    file: "held-bass-d.mid",
    about: "Lena holds a low D with the left hand while the right hand changes chords above it",
    key: "D",
    shows: { techniques: ["inversion"], heldNotes: true },
    build: () =>
      render(
        [
          { lh: [38], rh: [62, 66, 69] },
          { lh: [38], rh: [62, 67, 71] },
          { lh: [38], rh: [61, 64, 69] },
          { lh: [38], rh: [62, 66, 69] },
        ],
        { bpm: 80, holdBassFor: 4, twoTracks: true, jitter: 0.005, seed: 15 },
        "Held bass in D",
      ),
  },
  {
    file: "clumsy-root-position-d.mid",
    about: "Owen's first try at I IV V I in D: every chord in root position, the hand jumping as a block",
    key: "D",
    target: "I IV V I",
    shows: { flags: ["root-position-leap"] },
    build: () =>
      render(
        exercise("three-chord-smoothing-d").clumsy,
        { bpm: 80, jitter: 0.04, velocitySpread: 0.2, seed: 16 },
        "Root-position leaps in D",
      ),
  },
  {
    file: "clumsy-top-line-d.mid",
    about: "A take whose top note jumps a seventh and more between chords",
    key: "D",
    shows: { flags: ["top-line-leap"] },
    build: () =>
      render(
        [
          { lh: [], rh: [62, 66, 69] },
          { lh: [], rh: [71, 74, 79] },
          { lh: [], rh: [61, 64, 69] },
          { lh: [], rh: [66, 69, 74] },
        ],
        { bpm: 80, jitter: 0.03, seed: 17 },
        "Top-line leaps in D",
      ),
  },
  {
    file: "clumsy-falling-bass-eb.mid",
    about: "The falling bass with the 3rd of Bb doubled over its own bass and a muddy low third under Ab",
    key: "Eb",
    target: "Eb Bb/D Cm Cm/Bb Ab",
    shows: { flags: ["doubled-bass-third", "muddy-low-interval"] },
    build: () =>
      render(
        exercise("falling-bass-eb").clumsy,
        { bpm: 76, jitter: 0.03, twoTracks: true, seed: 18 },
        "Falling bass, first try",
      ),
  },
  {
    file: "forearm-cluster.mid",
    about: "A nine-note forearm cluster between two chords: too many notes to grade",
    key: "C",
    shows: { flags: ["too-many-notes"] },
    build: () =>
      render(
        [
          { lh: [], rh: [60, 64, 67] },
          { lh: [], rh: [48, 50, 52, 53, 55, 57, 59, 60, 62] },
          { lh: [], rh: [60, 65, 69] },
        ],
        { bpm: 90, seed: 19 },
        "Cluster",
      ),
  },
];
