import { Button } from "~/components/Button";
import { clock } from "~/lib/noteText";
import type { PlaybackState } from "./usePlayback";

/** Play the take, hear the smoother path, stop; and what is sounding now. */
export function PlaybackBar({
  state,
  available,
  durationSec,
  onPlayTake,
  onPlaySmoother,
  onStop,
}: {
  state: PlaybackState;
  available: boolean;
  durationSec: number;
  onPlayTake: () => void;
  onPlaySmoother: () => void;
  onStop: () => void;
}) {
  const playing = state.mode !== null;
  return (
    <div className="flex flex-wrap items-center gap-3">
      <Button
        type="button"
        onClick={onPlayTake}
        disabled={!available}
        aria-pressed={state.mode === "take"}
        className={state.mode === "take" ? "ring-2 ring-tide ring-offset-2" : ""}
      >
        <svg aria-hidden="true" viewBox="0 0 12 12" className="h-3 w-3 fill-current">
          <path d="M2 1l9 5-9 5z" />
        </svg>
        Play take
      </Button>
      <Button
        type="button"
        variant="secondary"
        onClick={onPlaySmoother}
        disabled={!available}
        aria-pressed={state.mode === "smoother"}
        className={state.mode === "smoother" ? "border-tide ring-2 ring-tide ring-offset-2" : ""}
      >
        Hear the smoother path
      </Button>
      <Button type="button" variant="quiet" onClick={onStop} disabled={!playing}>
        <svg aria-hidden="true" viewBox="0 0 12 12" className="h-3 w-3 fill-current">
          <rect x="2" y="2" width="8" height="8" />
        </svg>
        Stop
      </Button>
      <p role="status" className="text-sm text-ink-soft" data-testid="playback-status">
        {state.error
          ? state.error
          : playing
            ? `Playing ${state.label ?? ""}${state.mode !== "snippet" && state.time !== null ? ` · ${clock(state.time)} of ${clock(durationSec)}` : ""}`
            : available
              ? "Sound is made in your browser; use headphones to hear the voices clearly."
              : "Playback starts once the page has loaded."}
      </p>
    </div>
  );
}
