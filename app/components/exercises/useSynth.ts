import { useCallback, useEffect, useRef, useState } from "react";
import type { PlannedNote } from "~/browser/playbackPlan";
import { createPlayer, webAudioAvailable, type Player } from "~/browser/player.client";

/** One synth for the exercise page: `play` stops whatever was sounding; `playing` names what sounds. */
export function useSynth() {
  const player = useRef<Player | null>(null);
  const [available, setAvailable] = useState(false);
  const [playing, setPlaying] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);

  useEffect(() => {
    setAvailable(webAudioAvailable());
    return () => player.current?.stop();
  }, []);

  const stop = useCallback(() => {
    player.current?.stop();
    setPlaying(null);
  }, []);

  const play = useCallback((what: string, plan: PlannedNote[]) => {
    player.current ??= createPlayer();
    setError(null);
    setPlaying(what);
    player.current.play(plan, { onEnd: () => setPlaying(null) }).catch((e: unknown) => {
      setPlaying(null);
      setError(e instanceof Error ? e.message : "Sound could not start.");
    });
  }, []);

  return { available, playing, error, play, stop };
}
