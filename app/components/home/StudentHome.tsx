import { Link } from "react-router";
import { ButtonLink } from "~/components/Button";
import { Card } from "~/components/Card";
import { EmptyState } from "~/components/EmptyState";
import { PracticeCare } from "~/components/PracticeCare";
import { dayLabel, pretty } from "~/lib/noteText";
import { TakesTable, type TakeRow } from "./TakesTable";
import { WeeklyChart, type WeekFigures } from "./WeeklyChart";

export type DueExercise = { id: string; title: string; keys: string[]; dueDate: string | null; progression: string; tempo: number | null };

/** "due today", "due in 3 days", "2 days overdue" against the studio's today (YYYY-MM-DD). */
export function dueWords(dueDate: string, today: string): string {
  const days = Math.round((Date.parse(`${dueDate}T00:00:00Z`) - Date.parse(`${today}T00:00:00Z`)) / 86_400_000);
  if (days === 0) return "due today";
  if (days === 1) return "due tomorrow";
  if (days > 1) return `due in ${days} days`;
  return days === -1 ? "1 day overdue" : `${-days} days overdue`;
}

function ExerciseItem({ exercise, today }: { exercise: DueExercise; today: string }) {
  const overdue = exercise.dueDate !== null && exercise.dueDate < today;
  const key = exercise.keys[0];
  return (
    <li className="flex flex-wrap items-center justify-between gap-3 py-3">
      <div className="min-w-0">
        <p className="font-semibold">{exercise.title}</p>
        <p className="text-sm text-ink-soft">
          <span className="font-mono text-ink">{pretty(exercise.progression)}</span>
          {exercise.keys.length ? ` · in ${exercise.keys.map(pretty).join(", ")}` : ""}
          {exercise.tempo ? ` · ♩ = ${exercise.tempo}` : ""}
        </p>
      </div>
      <div className="flex items-center gap-3">
        {exercise.dueDate ? (
          <span
            className={`rounded px-2 py-0.5 text-xs font-semibold ${overdue ? "bg-brick-pale text-brick" : "bg-tide-pale text-tide-dark"}`}
          >
            {dueWords(exercise.dueDate, today)} · {dayLabel(`${exercise.dueDate}T00:00:00Z`)}
          </span>
        ) : null}
        <ButtonLink to={`/takes/new?exercise=${exercise.id}${key ? `&key=${encodeURIComponent(key)}` : ""}`} variant="secondary">
          Upload a take<span className="sr-only"> of {exercise.title}</span>
        </ButtonLink>
      </div>
    </li>
  );
}

/** A student's home: what is due, the latest takes, and how the weeks are going. */
export function StudentHome({
  exercises,
  takes,
  weeks,
  today,
}: {
  exercises: DueExercise[];
  takes: TakeRow[];
  weeks: WeekFigures[];
  today: string;
}) {
  const dated = exercises.filter((e) => e.dueDate !== null).sort((a, b) => a.dueDate!.localeCompare(b.dueDate!));
  const open = exercises.filter((e) => e.dueDate === null);
  return (
    <div className="flex flex-col gap-6">
      <Card title="Due exercises" actions={<ButtonLink to="/takes/new">Upload takes</ButtonLink>}>
        {exercises.length === 0 ? (
          <p className="text-sm text-ink-soft">
            Your teacher has not set an exercise yet. Free practice takes are welcome in the meantime.
          </p>
        ) : (
          <ul className="divide-y divide-line">
            {[...dated, ...open].map((e) => (
              <ExerciseItem key={e.id} exercise={e} today={today} />
            ))}
          </ul>
        )}
      </Card>

      <Card title="Week by week">
        {weeks.length === 0 ? (
          <p className="text-sm text-ink-soft">Your smoothness and score appear here by week once a take is analysed.</p>
        ) : (
          <WeeklyChart weeks={weeks} />
        )}
        <p className="mt-3 text-xs text-ink-soft">
          Smoothness is the motion you could have had over the motion you played, summed over the week.{" "}
          <Link to="/privacy" className="underline">
            What Nearnote keeps
          </Link>
        </p>
      </Card>

      <Card title="Latest takes">
        {takes.length === 0 ? (
          <EmptyState title="No takes yet" action={<ButtonLink to="/takes/new">Upload your first take</ButtonLink>}>
            Record a few passes of your exercise as MIDI and upload them: Nearnote goes through every chord change and shows what could move
            less.
          </EmptyState>
        ) : (
          <TakesTable takes={takes} />
        )}
      </Card>

      <PracticeCare />
    </div>
  );
}
