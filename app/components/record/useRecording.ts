import { useCallback, useEffect, useRef, useState } from "react";
import { analyseMidi } from "~/analysis";
import type { NoteEvent, PedalSpan } from "~/analysis/types";
import { gradeSoFar, GradeThrottle, type LiveGrade } from "~/browser/liveGrading";
import { createMetronome, type Metronome } from "~/browser/metronome.client";
import { clampBpm, encodeMidi, recordingFileName } from "~/browser/midiEncode";
import { MAX_RECORDING_SECONDS, NoteRecorder, type PlayedEvent } from "~/browser/noteRecorder";

export type Phase = "idle" | "counting" | "recording" | "stopped";

export type FinishedTake = {
  file: File;
  notes: NoteEvent[];
  pedal: PedalSpan[];
  grade: LiveGrade;
  durationSec: number;
};

const TICK_MS = 100;
const COUNT_IN_BEATS = 4;

function gradeFile(bytes: Uint8Array, key: string | undefined, fallback: LiveGrade): LiveGrade {
  // The stopped take is graded from the very bytes that will be uploaded, so what the panel
  // shows is what the server will store (given the same key).
  try {
    const a = analyseMidi(bytes, { key });
    return {
      chords: a.chords,
      settled: a.chords.length,
      changes: a.changes,
      key: a.summary.key,
      keySource: a.summary.keySource,
      noteCount: fallback.noteCount,
    };
  } catch {
    return fallback;
  }
}

/**
 * One recording at a time: count-in, capture, live grading on a throttle, stop into a
 * Standard MIDI File. Keys currently down are tracked whether or not a take is running, so
 * the keyboard drawing answers as soon as a keyboard is connected.
 */
export function useRecording(options: { keyName?: string; bpm: number; countIn: boolean; clicks: boolean }) {
  const [phase, setPhase] = useState<Phase>("idle");
  const [held, setHeld] = useState<number[]>([]);
  const [live, setLive] = useState<LiveGrade | null>(null);
  const [elapsed, setElapsed] = useState(0);
  const [countBeat, setCountBeat] = useState<number | null>(null);
  const [take, setTake] = useState<FinishedTake | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const phaseRef = useRef<Phase>("idle");
  const recorder = useRef<NoteRecorder | null>(null);
  const down = useRef(new Set<number>());
  const events = useRef(0);
  const metronome = useRef<Metronome | null>(null);
  const startedAt = useRef(new Date());
  const opts = useRef(options);
  opts.current = options;

  const go = (next: Phase) => {
    phaseRef.current = next;
    setPhase(next);
  };

  const onEvent = useCallback((event: PlayedEvent, timeMs: number) => {
    if (event.kind === "on") down.current.add(event.midi);
    if (event.kind === "off") down.current.delete(event.midi);
    if (event.kind !== "pedal") setHeld([...down.current].sort((a, b) => a - b));
    const p = phaseRef.current;
    if ((p === "counting" || p === "recording") && recorder.current) {
      recorder.current.handle(event, timeMs);
      events.current++;
    }
  }, []);

  const start = useCallback(async () => {
    if (phaseRef.current !== "idle") return;
    const { bpm, countIn, clicks } = opts.current;
    setNotice(null);
    setLive(null);
    setElapsed(0);
    go(countIn ? "counting" : "recording");
    // Created inside the click, before any await, so the browser lets the clicks sound.
    metronome.current ??= createMetronome();
    const beats = countIn ? COUNT_IN_BEATS : 0;
    let downbeatMs = performance.now();
    if (countIn || clicks) {
      const started = await metronome.current.start({
        bpm: clampBpm(bpm),
        countIn: beats,
        keepGoing: clicks,
        onBeat: (beat) => setCountBeat(beat.index < 0 ? -beat.index : null),
      });
      downbeatMs = started.downbeatMs;
      // Stopped while the audio was starting.
      if (phaseRef.current === "idle") {
        metronome.current.stop();
        return;
      }
    }
    // Notes played during the count-in are kept, starting at the take's first beat.
    recorder.current = new NoteRecorder(downbeatMs);
    startedAt.current = new Date(Date.now() + Math.max(0, downbeatMs - performance.now()));
    if (beats > 0) {
      window.setTimeout(
        () => {
          if (phaseRef.current === "counting") go("recording");
          setCountBeat(null);
        },
        Math.max(0, downbeatMs - performance.now()),
      );
    }
  }, []);

  const stop = useCallback(() => {
    const p = phaseRef.current;
    if (p !== "counting" && p !== "recording") return;
    metronome.current?.stop();
    setCountBeat(null);
    const rec = recorder.current;
    recorder.current = null;
    const list = rec ? rec.snapshot(performance.now()) : { notes: [], pedal: [] };
    if (list.notes.length === 0) {
      go("idle");
      setLive(null);
      setNotice("Nothing was played, so there is nothing to keep.");
      return;
    }
    const { bpm, keyName } = opts.current;
    const bytes = encodeMidi({ notes: list.notes, pedal: list.pedal, bpm, name: "Nearnote recording" });
    const file = new File([new Uint8Array(bytes)], recordingFileName(startedAt.current), {
      type: "audio/midi",
      lastModified: startedAt.current.getTime(),
    });
    const durationSec = list.notes.reduce((end, n) => Math.max(end, n.end), 0);
    const fallback = gradeSoFar(list, Number.POSITIVE_INFINITY, { key: keyName, bpm });
    const grade = gradeFile(bytes, keyName, fallback);
    setTake({ file, notes: list.notes, pedal: list.pedal, grade, durationSec });
    setLive(grade);
    go("stopped");
  }, []);

  const discard = useCallback(() => {
    setTake(null);
    setLive(null);
    setElapsed(0);
    go("idle");
  }, []);

  // While a take runs: the clock, live grading on a throttle, and the length limit.
  useEffect(() => {
    if (phase !== "counting" && phase !== "recording") return;
    const throttle = new GradeThrottle();
    let gradedAt = -1;
    let allSettled = true;
    const timer = window.setInterval(() => {
      const rec = recorder.current;
      if (!rec) return;
      const now = performance.now();
      const sec = rec.elapsed(now);
      setElapsed(sec);
      if (sec >= MAX_RECORDING_SECONDS) {
        stop();
        setNotice("The recording stopped at 30 minutes, the longest take Nearnote grades.");
        return;
      }
      if (!throttle.due(now)) return;
      const seen = events.current;
      // Nothing new played and nothing left to settle: skip the work.
      if (seen === gradedAt && allSettled) return;
      const { keyName, bpm } = opts.current;
      const t0 = performance.now();
      const grade = gradeSoFar(rec.snapshot(now), sec, { key: keyName, bpm });
      throttle.ran(t0, performance.now() - t0);
      gradedAt = seen;
      allSettled = grade.settled === grade.chords.length && rec.held().length === 0;
      setLive(grade);
    }, TICK_MS);
    return () => window.clearInterval(timer);
  }, [phase, stop]);

  useEffect(() => () => metronome.current?.stop(), []);

  return { phase, held, live, elapsed, countBeat, take, notice, onEvent, start, stop, discard };
}
