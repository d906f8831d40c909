// Count-in and metronome clicks on plain Web Audio: a short sine blip per beat, scheduled a
// little ahead on the audio clock (timers alone drift and stutter). The schedule itself is
// pure (`beatsBetween`) and tested; the rest only talks to the AudioContext.

export type Beat = {
  /** seconds from the first count-in beat */
  time: number;
  /** 0-based beat number; negative during the count-in (−4 … −1), 0 = the take's first beat */
  index: number;
  /** first beat of a 4/4 bar: a higher click */
  accent: boolean;
};

export const BEATS_PER_BAR = 4; // the count-in is one bar of four (common practice)

/**
 * Beats that fall in [from, to) seconds after the first click, for a count-in of
 * `countIn` beats followed, when `keepGoing`, by clicks through the take.
 */
export function beatsBetween(bpm: number, countIn: number, keepGoing: boolean, from: number, to: number): Beat[] {
  const step = 60 / bpm;
  const out: Beat[] = [];
  const first = Math.max(0, Math.ceil(from / step - 1e-9));
  for (let k = first; k * step < to; k++) {
    const index = k - countIn;
    if (index >= 0 && !keepGoing) break;
    out.push({ time: k * step, index, accent: ((index % BEATS_PER_BAR) + BEATS_PER_BAR) % BEATS_PER_BAR === 0 });
  }
  return out;
}

export type ClickStart = {
  /** when beat 0 (the take's start) sounds, on the page's performance.now() clock */
  downbeatMs: number;
};

export type Metronome = {
  /**
   * Starts clicking; resolves at once with the time of the take's first beat. Call from a
   * click handler: browsers only let a user gesture start sound.
   */
  start(options: {
    bpm: number;
    countIn: number;
    keepGoing: boolean;
    onBeat?: (beat: Beat) => void;
  }): Promise<ClickStart>;
  stop(): void;
};

const LOOKAHEAD_SEC = 0.12;
const TICK_MS = 25;
const LEAD_IN_SEC = 0.1; // room to schedule the first click

type AudioContextClass = typeof AudioContext;

function audioContextClass(): AudioContextClass | null {
  if (typeof window === "undefined") return null;
  const w = window as unknown as { AudioContext?: AudioContextClass; webkitAudioContext?: AudioContextClass };
  return w.AudioContext ?? w.webkitAudioContext ?? null;
}

function click(ctx: AudioContext, at: number, accent: boolean) {
  const osc = ctx.createOscillator();
  const gain = ctx.createGain();
  osc.frequency.value = accent ? 1760 : 1320;
  gain.gain.setValueAtTime(0, at);
  gain.gain.linearRampToValueAtTime(accent ? 0.5 : 0.3, at + 0.002);
  gain.gain.exponentialRampToValueAtTime(0.001, at + 0.05);
  osc.connect(gain).connect(ctx.destination);
  osc.start(at);
  osc.stop(at + 0.06);
  osc.onended = () => gain.disconnect();
}

export function createMetronome(): Metronome {
  let ctx: AudioContext | null = null;
  let timer: ReturnType<typeof setInterval> | null = null;
  const beatTimers = new Set<ReturnType<typeof setTimeout>>();

  function stop() {
    if (timer !== null) clearInterval(timer);
    timer = null;
    for (const t of beatTimers) clearTimeout(t);
    beatTimers.clear();
  }

  async function start({ bpm, countIn, keepGoing, onBeat }: Parameters<Metronome["start"]>[0]): Promise<ClickStart> {
    stop();
    const Ctor = audioContextClass();
    // Created inside the user's click, so the browser lets it sound.
    if (Ctor && !ctx) ctx = new Ctor();
    const audio = ctx;
    if (!audio) {
      // No Web Audio: no clicks, but the count-in still waits its beats.
      return { downbeatMs: performance.now() + (countIn * 60_000) / bpm };
    }
    if (audio.state === "suspended") await audio.resume().catch(() => undefined);
    const origin = audio.currentTime + LEAD_IN_SEC;
    const perfOrigin = performance.now() + LEAD_IN_SEC * 1000;
    let scheduledTo = 0;
    const tick = () => {
      const now = audio.currentTime - origin;
      const until = now + LOOKAHEAD_SEC;
      for (const beat of beatsBetween(bpm, countIn, keepGoing, scheduledTo, until)) {
        click(audio, origin + beat.time, beat.accent);
        if (onBeat) {
          const t = setTimeout(
            () => {
              beatTimers.delete(t);
              onBeat(beat);
            },
            Math.max(0, (beat.time - now) * 1000),
          );
          beatTimers.add(t);
        }
      }
      scheduledTo = until;
      if (!keepGoing && until > (countIn * 60) / bpm) {
        if (timer !== null) clearInterval(timer);
        timer = null;
      }
    };
    tick();
    timer = setInterval(tick, TICK_MS);
    return { downbeatMs: perfOrigin + (countIn * 60_000) / bpm };
  }

  return { start, stop };
}
