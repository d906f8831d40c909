import type { NextStep } from "~/takes/nextStep";
import { Button } from "~/components/Button";

/**
 * "Next time": the one thing to work on, above the figures. A change links to its place in
 * the change list and plays its fix (the chord before, then the suggested voicing).
 */
export function NextStepPanel({
  step,
  canPlay,
  onOpen,
  onPlayFix,
}: {
  step: NextStep;
  canPlay: boolean;
  onOpen: (change: number) => void;
  onPlayFix: () => void;
}) {
  const change = step.kind === "motion" || step.kind === "flag" ? step.change : null;
  const fix = step.kind === "motion" || step.kind === "flag" ? step.fix : null;
  const tone =
    step.kind === "off-exercise"
      ? "border-brick bg-brick-pale/50"
      : step.kind === "clean"
        ? "border-moss bg-moss-pale/60"
        : "border-ochre bg-ochre-pale/60";
  return (
    <section
      aria-labelledby="next-time-heading"
      className={`rounded-lg border-2 px-4 py-3 ${tone}`}
      data-testid="next-step"
      data-kind={step.kind}
    >
      <h2 id="next-time-heading" className="text-lg font-semibold">
        Next time
      </h2>
      {step.kind === "motion" || step.kind === "flag" ? (
        <p className="font-semibold" data-testid="next-step-title">
          {step.title}
        </p>
      ) : null}
      <p className="mt-1">{step.text}</p>
      {change !== null || fix ? (
        <div className="mt-3 flex flex-wrap items-center gap-3">
          {change !== null ? (
            <a
              href={`#change-${change}`}
              onClick={(e) => {
                e.preventDefault();
                onOpen(change);
              }}
              className="font-semibold text-tide-dark underline underline-offset-2"
            >
              Go to change {change + 1}
            </a>
          ) : null}
          {fix && canPlay ? (
            <Button type="button" variant="secondary" onClick={onPlayFix}>
              Hear the fix
            </Button>
          ) : null}
        </div>
      ) : null}
    </section>
  );
}
