import { useEffect } from "react";
import { useBlocker } from "react-router";
import { Button } from "~/components/Button";

/**
 * Asks before a recording is lost: the browser's own "leave site?" prompt for reloads, closed
 * tabs and typed addresses (`beforeunload`), and our dialog for links inside Nearnote.
 */
export function LeaveGuard({ when, what }: { when: boolean; what: "recording" | "unsent" }) {
  const blocker = useBlocker(
    ({ currentLocation, nextLocation }) => when && currentLocation.pathname !== nextLocation.pathname,
  );

  useEffect(() => {
    if (!when) return;
    const ask = (e: BeforeUnloadEvent) => {
      e.preventDefault();
      // Older Chromium versions only ask when returnValue is set.
      e.returnValue = "";
    };
    window.addEventListener("beforeunload", ask);
    return () => window.removeEventListener("beforeunload", ask);
  }, [when]);

  // Once there is nothing left to lose, a held navigation may go on.
  useEffect(() => {
    if (blocker.state === "blocked" && !when) blocker.proceed();
  }, [blocker, when]);

  if (blocker.state !== "blocked") return null;
  return (
    <div className="fixed inset-0 z-50 flex items-center justify-center bg-ink/40 p-4" role="presentation">
      <div
        role="alertdialog"
        aria-modal="true"
        aria-labelledby="leave-guard-title"
        aria-describedby="leave-guard-text"
        className="w-full max-w-md rounded-lg border border-line bg-card p-5 shadow-lg"
        onKeyDown={(e) => e.key === "Escape" && blocker.reset()}
      >
        <h2 id="leave-guard-title" className="text-lg font-semibold">
          {what === "recording" ? "You are still recording" : "This recording is not uploaded yet"}
        </h2>
        <p id="leave-guard-text" className="mt-2 text-sm text-ink-soft">
          If you leave this page now, the {what === "recording" ? "take you are playing" : "recording"} is lost. Stay to{" "}
          {what === "recording" ? "stop and upload it" : "upload it"} first.
        </p>
        <div className="mt-4 flex flex-wrap justify-end gap-3">
          <Button type="button" variant="secondary" onClick={() => blocker.proceed()}>
            Leave and lose it
          </Button>
          <Button type="button" autoFocus onClick={() => blocker.reset()}>
            Stay on this page
          </Button>
        </div>
      </div>
    </div>
  );
}
