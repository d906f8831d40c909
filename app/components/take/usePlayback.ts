import { useCallback, useEffect, useRef, useState } from "react";
import { scalePlan, type PlannedNote } from "~/browser/playbackPlan";
import { createPlayer, webAudioAvailable, type Player } from "~/browser/player.client";

export type PlaybackMode = "take" | "smoother" | "snippet" | "loop";
export type PlaybackState = {
  mode: PlaybackMode | null;
  label: string | null;
  /** position in the take's own seconds (the plan's offset added, the speed taken out) */
  time: number | null;
  error: string | null;
  paused: boolean;
  /** the sound playing: the recorded piano, or the synth when the piano could not load */
  sound: "piano" | "synth" | "loading" | null;
};

const IDLE: PlaybackState = { mode: null, label: null, time: null, error: null, paused: false, sound: null };

/**
 * One player per page; starting anything stops what was sounding. Plans play at `speed`
 * (1 = as recorded; changing it starts what is playing again at the new speed); a loop starts
 * again when it ends until stopped. `offset` is where the
 * plan's time 0 lies in the take, so the piano roll's playhead follows a looped change.
 */
export function usePlayback() {
  const player = useRef<Player | null>(null);
  const [state, setState] = useState<PlaybackState>(IDLE);
  const [available, setAvailable] = useState(false);
  const [speed, setSpeedState] = useState(1);
  const speedRef = useRef(1);
  // What is playing, so a change of speed starts it again at the new speed.
  const last = useRef<{
    mode: PlaybackMode;
    plan: PlannedNote[];
    label: string;
    opts: { offset?: number; loop?: boolean };
  } | null>(null);

  useEffect(() => {
    setAvailable(webAudioAvailable());
    return () => player.current?.stop();
  }, []);

  const stop = useCallback(() => {
    player.current?.stop();
    last.current = null;
    setState(IDLE);
  }, []);

  const play = useCallback(
    (mode: PlaybackMode, plan: PlannedNote[], label: string, opts: { offset?: number; loop?: boolean } = {}) => {
      player.current ??= createPlayer();
      last.current = { mode, plan, label, opts };
      const speed = speedRef.current;
      const offset = opts.offset ?? 0;
      const scaled = scalePlan(plan, speed);
      setState({ mode, label, time: offset, error: null, paused: false, sound: "loading" });
      const start = (): void => {
        player
          .current!.play(scaled, {
            piano: true,
            onSound: (sound) => setState((s) => (s.mode === mode ? { ...s, sound } : s)),
            onTime: (time) => setState((s) => (s.mode === mode ? { ...s, time: offset + time * speed } : s)),
            onEnd: () => {
              if (opts.loop) return start();
              last.current = null;
              setState(IDLE);
            },
          })
          .catch((e: unknown) => {
            last.current = null;
            setState({ ...IDLE, error: e instanceof Error ? e.message : "Sound could not start." });
          });
      };
      start();
    },
    [],
  );

  const setSpeed = useCallback(
    (next: number) => {
      speedRef.current = next;
      setSpeedState(next);
      const playing = last.current;
      if (playing) play(playing.mode, playing.plan, playing.label, playing.opts);
    },
    [play],
  );

  const pause = useCallback(() => {
    void player.current?.pause();
    setState((s) => (s.mode ? { ...s, paused: true } : s));
  }, []);

  const resume = useCallback(() => {
    void player.current?.resume();
    setState((s) => (s.mode ? { ...s, paused: false } : s));
  }, []);

  return { state, available, play, stop, pause, resume, speed, setSpeed };
}
