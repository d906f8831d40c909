// Nearnote's own small keyboard synth on plain Web Audio: two oscillators and a gain
// envelope per note, scheduled a little ahead of time. No library and no workers, so the
// content-security policy stays strict. Browser only (`.client.ts`).
import { midiFrequency, notesInWindow, planEnd, type PlannedNote } from "./playbackPlan";

const LOOKAHEAD_SEC = 0.6;
const TICK_MS = 120;
const RELEASE_SEC = 0.25;

export type PlayOptions = {
  /** Called on every animation frame with the plan time in seconds. */
  onTime?: (sec: number) => void;
  /** Called once when the plan has finished sounding (not when stopped). */
  onEnd?: () => void;
};

export type Player = {
  play: (plan: PlannedNote[], options?: PlayOptions) => Promise<void>;
  stop: () => void;
};

type AudioContextClass = typeof AudioContext;

function audioContextClass(): AudioContextClass | null {
  const w = window as unknown as { AudioContext?: AudioContextClass; webkitAudioContext?: AudioContextClass };
  return w.AudioContext ?? w.webkitAudioContext ?? null;
}

export function webAudioAvailable(): boolean {
  return typeof window !== "undefined" && audioContextClass() !== null;
}

/** One note: a triangle wave with a quiet sine an octave up, through a piano-like envelope. */
function voice(ctx: AudioContext, out: AudioNode, n: PlannedNote, at: number, live: Set<OscillatorNode>) {
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
  const live = new Set<OscillatorNode>();

  function stop() {
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
    const Ctor = audioContextClass();
    if (!Ctor) throw new Error("This browser cannot play sound (no Web Audio).");
    ctx ??= new Ctor();
    if (ctx.state === "suspended") await ctx.resume();
    const audio = ctx;
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
      for (const n of window.notes) voice(audio, out, n, origin + Math.max(n.start, now), live);
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

  return { play, stop };
}
