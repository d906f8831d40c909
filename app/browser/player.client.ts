// The page-side face of playback: the synth and piano code (synth.client.ts) is
// fetched at the first play, not with the page. Browser only (`.client.ts`).
import type { PlannedNote } from "./playbackPlan";
import type { Player, PlayOptions } from "./synth.client";

export type { Player, PlayOptions };

/** Whether this browser can play sound at all (checked without loading the player). */
export function webAudioAvailable(): boolean {
  if (typeof window === "undefined") return false;
  const w = window as unknown as { AudioContext?: unknown; webkitAudioContext?: unknown };
  return Boolean(w.AudioContext ?? w.webkitAudioContext);
}

/** A player that loads the real one when it first plays; stop, pause and resume before that do nothing. */
export function createPlayer(): Player {
  let loading: Promise<Player> | null = null;
  let real: Player | null = null;
  let wanted = 0; // the latest play asked for; a stop before the code arrives cancels it
  const load = () =>
    (loading ??= import("./synth.client").then((m) => {
      real = m.createPlayer();
      return real;
    }));
  return {
    async play(plan: PlannedNote[], options?: PlayOptions) {
      const ticket = ++wanted;
      const player = real ?? (await load());
      if (ticket !== wanted) return;
      return player.play(plan, options);
    },
    stop() {
      wanted++;
      real?.stop();
    },
    pause: async () => real?.pause(),
    resume: async () => real?.resume(),
  };
}
