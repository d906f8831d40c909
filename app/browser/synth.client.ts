// Playback on plain Web Audio, scheduled a little ahead of time. With `piano: true` the notes
// are the recorded grand piano served from /piano/ (only the files a plan needs, fetched when
// it starts); without it, or when a file cannot be had, Nearnote's own small synth plays (two
// oscillators and a gain envelope per note). No library and no workers, so the
// content-security policy stays strict. Browser only (`.client.ts`).
import { filesFor, sampleFor } from "./pianoSamples";
import { midiFrequency, notesInWindow, planEnd, type PlannedNote } from "./playbackPlan";

const LOOKAHEAD_SEC = 0.6;
const TICK_MS = 120;
const RELEASE_SEC = 0.25;

export type PlayOptions = {
  /** Called on every animation frame with the plan time in seconds. */
  onTime?: (sec: number) => void;
  /** Called once when the plan has finished sounding (not when stopped). */
  onEnd?: () => void;
  /** Play the recorded piano (falls back to the synth when its files cannot be loaded). */
  piano?: boolean;
  /** Told which sound is playing once the plan starts. */
  onSound?: (sound: "piano" | "synth") => void;
};

export type Player = {
  play: (plan: PlannedNote[], options?: PlayOptions) => Promise<void>;
  stop: () => void;
  /** Holds the sound where it is (the audio clock stops); resume goes on from there. */
  pause: () => Promise<void>;
  resume: () => Promise<void>;
};

/** Decoded piano files by name, shared by every player on the page; a failed file stays null. */
const pianoBuffers = new Map<string, Promise<AudioBuffer | null>>();
const PIANO_WAIT_MS = 8000;

function loadPianoFile(ctx: AudioContext, file: string): Promise<AudioBuffer | null> {
  let p = pianoBuffers.get(file);
  if (!p) {
    p = fetch(`/piano/${file}`)
      .then((r) => (r.ok ? r.arrayBuffer() : Promise.reject(new Error(r.statusText))))
      .then((bytes) => ctx.decodeAudioData(bytes))
      .catch(() => null);
    pianoBuffers.set(file, p);
  }
  return p;
}

/** The files a plan needs, or null when one is missing or they take too long to arrive. */
async function pianoFor(ctx: AudioContext, plan: readonly PlannedNote[]): Promise<Map<string, AudioBuffer> | null> {
  const files = filesFor(plan.map((n) => n.midi));
  const timeout = new Promise<null>((resolve) => setTimeout(() => resolve(null), PIANO_WAIT_MS));
  const loaded = await Promise.race([Promise.all(files.map((f) => loadPianoFile(ctx, f))), timeout]);
  if (!loaded || loaded.some((b) => b === null)) return null;
  return new Map(files.map((f, i) => [f, loaded[i]!]));
}

/** One note from the recorded piano: the nearest sampled key at the rate that makes its pitch. */
function pianoVoice(
  ctx: AudioContext,
  out: AudioNode,
  n: PlannedNote,
  at: number,
  buffers: Map<string, AudioBuffer>,
  live: Set<AudioScheduledSourceNode>,
) {
  const { file, rate } = sampleFor(n.midi);
  const buffer = buffers.get(file);
  if (!buffer) return;
  const src = ctx.createBufferSource();
  src.buffer = buffer;
  src.playbackRate.value = rate;
  const env = ctx.createGain();
  const level = 0.55 * (0.3 + 0.7 * Math.min(1, Math.max(0, n.velocity)));
  const length = Math.max(0.06, n.end - n.start);
  env.gain.setValueAtTime(level, at);
  // Key released: the damper stops the string quickly.
  env.gain.setTargetAtTime(0, at + length, 0.08);
  src.connect(env).connect(out);
  src.start(at);
  src.stop(at + length + 0.6);
  live.add(src);
  src.onended = () => {
    live.delete(src);
    env.disconnect();
  };
}

type AudioContextClass = typeof AudioContext;

function audioContextClass(): AudioContextClass | null {
  const w = window as unknown as { AudioContext?: AudioContextClass; webkitAudioContext?: AudioContextClass };
  return w.AudioContext ?? w.webkitAudioContext ?? null;
}

export function webAudioAvailable(): boolean {
  return typeof window !== "undefined" && audioContextClass() !== null;
}

/** One note: a triangle wave with a quiet sine an octave up, through a piano-like envelope. */
function voice(ctx: AudioContext, out: AudioNode, n: PlannedNote, at: number, live: Set<AudioScheduledSourceNode>) {
  const f = midiFrequency(n.midi);
  const peak = 0.16 * (0.35 + 0.65 * Math.min(1, Math.max(0, n.velocity)));
  const length = Math.max(0.06, n.end - n.start);
  const env = ctx.createGain();
  env.gain.setValueAtTime(0, at);
  env.gain.linearRampToValueAtTime(peak, at + 0.008);
  // Decay towards a sustain level, as a struck string fades while the key is held.
  env.gain.setTargetAtTime(peak * 0.35, at + 0.008, 0.35);
  env.gain.setTargetAtTime(0, at + length, RELEASE_SEC / 4);
  env.connect(out);
  const stopAt = at + length + RELEASE_SEC;
  for (const [type, mult, level] of [
    ["triangle", 1, 1],
    ["sine", 2, 0.18],
  ] as const) {
    const osc = ctx.createOscillator();
    osc.type = type;
    osc.frequency.setValueAtTime(f * mult, at);
    const g = ctx.createGain();
    g.gain.value = level;
    osc.connect(g).connect(env);
    osc.start(at);
    osc.stop(stopAt);
    live.add(osc);
    osc.onended = () => {
      live.delete(osc);
      g.disconnect();
      if (live.size === 0) env.disconnect();
    };
  }
}

export function createPlayer(): Player {
  let ctx: AudioContext | null = null;
  let master: GainNode | null = null;
  let timer: ReturnType<typeof setInterval> | null = null;
  let frame: number | null = null;
  const live = new Set<AudioScheduledSourceNode>();
  // Each play gets a number, so a plan whose files arrive after a newer play started stays silent.
  let generation = 0;

  function stop() {
    generation++;
    if (timer !== null) clearInterval(timer);
    if (frame !== null) cancelAnimationFrame(frame);
    timer = null;
    frame = null;
    for (const osc of live) {
      try {
        osc.stop();
      } catch {
        // already stopped
      }
    }
    live.clear();
    master?.disconnect();
    master = null;
  }

  async function play(plan: PlannedNote[], options: PlayOptions = {}) {
    stop();
    const mine = ++generation;
    const Ctor = audioContextClass();
    if (!Ctor) throw new Error("This browser cannot play sound (no Web Audio).");
    ctx ??= new Ctor();
    if (ctx.state === "suspended") await ctx.resume();
    const audio = ctx;
    const buffers = options.piano ? await pianoFor(audio, plan) : null;
    if (mine !== generation) return;
    options.onSound?.(buffers ? "piano" : "synth");
    const compressor = audio.createDynamicsCompressor();
    master = audio.createGain();
    master.gain.value = 0.9;
    master.connect(compressor).connect(audio.destination);
    const out = master;
    const origin = audio.currentTime + 0.08;
    const end = planEnd(plan);
    let cursor = 0;

    const tick = () => {
      const now = audio.currentTime - origin;
      const window = notesInWindow(plan, cursor, -Infinity, now + LOOKAHEAD_SEC);
      cursor = window.cursor;
      for (const n of window.notes) {
        const at = origin + Math.max(n.start, now);
        if (buffers) pianoVoice(audio, out, n, at, buffers, live);
        else voice(audio, out, n, at, live);
      }
    };
    tick();
    timer = setInterval(tick, TICK_MS);

    const animate = () => {
      const t = audio.currentTime - origin;
      options.onTime?.(Math.max(0, t));
      if (t > end + RELEASE_SEC) {
        stop();
        options.onEnd?.();
        return;
      }
      frame = requestAnimationFrame(animate);
    };
    frame = requestAnimationFrame(animate);
  }

  async function pause() {
    if (ctx && ctx.state === "running") await ctx.suspend();
  }

  async function resume() {
    if (ctx && ctx.state === "suspended") await ctx.resume();
  }

  return { play, stop, pause, resume };
}
