import { Link } from "react-router";
import { Card } from "~/components/Card";
import { pretty } from "~/lib/noteText";

type Props = {
  exercise: {
    id: string;
    title: string;
    keys: string[];
    dueDate: string | null;
    progression: string;
    done: boolean;
    progress: Array<{ key: string; takes: Array<{ id: string }>; best: number | null }>;
  };
};

/** One exercise on the student's list: its keys, takes and best score in each, and where to hand in. */
export function StudentExerciseCard({ exercise: e }: Props) {
  return (
    <Card data-testid="student-exercise">
      <div className="mb-2 flex flex-wrap items-baseline justify-between gap-3">
        <h3 className="text-lg font-semibold">
          <Link to={`/exercises/${e.id}`} className="text-tide-dark hover:underline">
            {e.title}
          </Link>
        </h3>
        <span className="text-sm text-ink-soft">{e.dueDate ? `due ${e.dueDate}` : "no due date"}</span>
      </div>
      <p className="mb-3 font-mono text-sm text-ink-soft">{e.progression}</p>
      <ul className="flex flex-wrap gap-2">
        {e.progress.map((p) => (
          <li key={p.key} className={`flex items-center gap-2 rounded-md border px-3 py-1.5 text-sm ${p.takes.length ? "border-moss bg-moss-pale" : "border-line bg-white"}`}>
            <span className="font-semibold">{pretty(p.key)}</span>
            {p.takes.length ? (
              <span>
                {p.takes.length} take{p.takes.length === 1 ? "" : "s"} · best {p.best ?? "–"}
              </span>
            ) : (
              <Link to={`/takes/new?exercise=${e.id}&key=${encodeURIComponent(p.key)}`} className="text-tide-dark underline-offset-2 hover:underline">
                hand in
              </Link>
            )}
          </li>
        ))}
      </ul>
    </Card>
  );
}
