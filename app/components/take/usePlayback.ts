import { useCallback, useEffect, useRef, useState } from "react";
import type { PlannedNote } from "~/lib/playbackPlan";
import { createPlayer, webAudioAvailable, type Player } from "~/lib/synth.client";

export type PlaybackMode = "take" | "smoother" | "snippet";
export type PlaybackState = { mode: PlaybackMode | null; label: string | null; time: number | null; error: string | null };

/** One synth per page; starting anything stops what was sounding. */
export function usePlayback() {
  const player = useRef<Player | null>(null);
  const [state, setState] = useState<PlaybackState>({ mode: null, label: null, time: null, error: null });
  const [available, setAvailable] = useState(false);

  useEffect(() => {
    setAvailable(webAudioAvailable());
    return () => player.current?.stop();
  }, []);

  const stop = useCallback(() => {
    player.current?.stop();
    setState({ mode: null, label: null, time: null, error: null });
  }, []);

  const play = useCallback((mode: PlaybackMode, plan: PlannedNote[], label: string) => {
    player.current ??= createPlayer();
    setState({ mode, label, time: 0, error: null });
    player.current
      .play(plan, {
        onTime: (time) => setState((s) => (s.mode === mode ? { ...s, time } : s)),
        onEnd: () => setState({ mode: null, label: null, time: null, error: null }),
      })
      .catch((e: unknown) =>
        setState({ mode: null, label: null, time: null, error: e instanceof Error ? e.message : "Sound could not start." }),
      );
  }, []);

  return { state, available, play, stop };
}
