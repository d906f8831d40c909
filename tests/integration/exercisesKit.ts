// Helpers for the exercise and feedback tests: takes written as Standard MIDI Files with
// `midi-file` (a second, independent MIDI writer from npm), and uploads through the real API.
import { writeMidi, type MidiEvent } from "midi-file";
import { expect } from "vitest";
import { ask } from "../support/app";
import { CookieJar, ORIGIN } from "./accountsKit";

/**
 * One chord per beat at the file's default tempo (no tempo event: 120 bpm by the SMF spec,
 * so 0.5 s a chord), all notes of a chord struck together and released just before the next.
 */
export function chordsMidi(chords: number[][]): Uint8Array {
  const ticksPerBeat = 480;
  const events: MidiEvent[] = [];
  let pending = 0;
  for (const chord of chords) {
    chord.forEach((n, i) => {
      events.push({
        deltaTime: i === 0 ? pending : 0,
        type: "noteOn",
        channel: 0,
        noteNumber: n,
        velocity: 80,
      } as MidiEvent);
    });
    chord.forEach((n, i) => {
      events.push({
        deltaTime: i === 0 ? 440 : 0,
        type: "noteOff",
        channel: 0,
        noteNumber: n,
        velocity: 0,
      } as MidiEvent);
    });
    pending = ticksPerBeat - 440;
  }
  events.push({ deltaTime: 0, type: "endOfTrack", meta: true } as MidiEvent);
  return new Uint8Array(
    writeMidi({ header: { format: 0, numTracks: 1, ticksPerBeat }, tracks: [events] } as Parameters<
      typeof writeMidi
    >[0]),
  );
}

export type UploadAnswer = {
  id: string;
  status: string;
  error?: string;
  analysis: {
    summary: {
      accuracy?: number;
      loops?: number;
      mismatches?: Array<Record<string, unknown>>;
      score: number;
      key: string;
    };
  };
};

export async function uploadTake(jar: CookieJar, bytes: Uint8Array, fields: Record<string, string>, name = "take.mid") {
  const form = new FormData();
  form.append("file", new File([new Uint8Array(bytes)], name, { type: "audio/midi" }));
  for (const [k, v] of Object.entries(fields)) form.append(k, v);
  const request = new Request(`${ORIGIN}/api/takes`, {
    method: "POST",
    body: form,
    headers: { Cookie: jar.header(), Origin: ORIGIN },
  });
  const result = await ask<UploadAnswer>(request);
  return { status: result.status, body: result.data };
}

export async function uploadAnalysed(jar: CookieJar, bytes: Uint8Array, fields: Record<string, string>) {
  const r = await uploadTake(jar, bytes, fields);
  expect(r.status, JSON.stringify(r.body)).toBe(201);
  return r.body;
}

/** A form post the way a browser sends one from our pages. */
export function formPost(
  pathAndQuery: string,
  fields: Array<[string, string]> | Record<string, string>,
  jar: CookieJar,
) {
  const body = new URLSearchParams(Array.isArray(fields) ? fields : Object.entries(fields));
  return new Request(ORIGIN + pathAndQuery, {
    method: "POST",
    body,
    headers: { Cookie: jar.header(), Origin: ORIGIN },
  });
}
