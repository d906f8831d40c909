import { checkProgression } from "~/utils/exerciseProgression";
import { pretty } from "~/utils/noteText";

/**
 * The progression as the engine reads it, in every key of the exercise, recomputed as the
 * teacher types (the parser is pure TypeScript and runs in the browser). A bad token is named
 * with its position, so the teacher can fix it before saving.
 */
export function ProgressionPreview({ progression, keys }: { progression: string; keys: string[] }) {
  if (!progression.trim()) {
    return <p className="text-sm text-ink-soft">The chords will appear here, in each key, as you type.</p>;
  }
  const check = checkProgression(progression, keys);
  if (!check.ok) {
    return (
      <p
        className="rounded-md border-l-4 border-brick bg-brick-pale px-3 py-2 text-sm text-brick"
        data-testid="progression-error"
      >
        {check.message}
      </p>
    );
  }
  return (
    <div className="flex flex-col gap-2" data-testid="progression-preview" aria-live="polite">
      {check.keys.map((k) => (
        <div key={k.key} className="flex flex-wrap items-baseline gap-2 text-sm">
          <span className="w-12 shrink-0 font-semibold text-tide-dark">{pretty(k.key)}</span>
          <ol className="flex flex-wrap gap-1.5">
            {k.chords.map((c, i) => (
              <li key={i} className="rounded border border-line bg-white px-2 py-0.5">
                <span className="font-semibold">{pretty(c.symbol)}</span>
                {c.roman ? <span className="ml-1 text-xs text-ink-soft">{pretty(c.roman)}</span> : null}
              </li>
            ))}
          </ol>
        </div>
      ))}
    </div>
  );
}
