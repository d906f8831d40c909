import { formatMetric, METRICS, type MetricId } from "~/utils/progressFigures";
import { TECHNIQUE_WORDS } from "~/takes/takeWords";
import type { studentProgress } from "~/models/studentProgress.server";
import { ChartTable, ProgressLines } from "./ProgressChart";
import { TechniqueTable } from "./TechniqueTable";
import { WeeklyFiguresTable } from "./WeeklyFiguresTable";

type Progress = ReturnType<typeof studentProgress>;

const HEADLINE: MetricId[] = ["takes", "practiceMinutes", "score", "smoothness", "leapsPer10", "accuracy"];

/** The page that gets printed: figures, charts, techniques gained, and the teacher's words. */
export function ReportSheet({
  student,
  studio,
  teacher,
  from,
  to,
  summary,
  progress: p,
}: {
  student: string;
  studio: string;
  teacher: string;
  from: string;
  to: string;
  summary: string | null;
  progress: Progress;
}) {
  return (
    <article
      aria-labelledby="report-title"
      className="report-sheet flex flex-col gap-6 rounded-lg border border-line bg-card p-6 shadow-sm"
    >
      <header className="report-block flex flex-wrap items-end justify-between gap-2 border-b border-line pb-3">
        <div>
          <p className="text-xs uppercase tracking-wide text-ink-soft">{studio} · progress report</p>
          <h1 id="report-title" className="text-2xl font-semibold">
            {student}
          </h1>
        </div>
        <p className="text-sm text-ink-soft">
          {from} to {to} · {p.weeks.length} weeks
        </p>
      </header>

      <section aria-label="The period in figures" className="report-block grid grid-cols-2 gap-3 sm:grid-cols-3">
        {HEADLINE.map((m) => (
          <div key={m} className="rounded-md border border-line px-3 py-2">
            <p className="text-xs text-ink-soft">{METRICS[m].label}</p>
            <p className="text-xl font-semibold tabular-nums">{formatMetric(m, p.total[m])}</p>
          </div>
        ))}
      </section>

      <section className={summary ? "report-block" : "report-block no-print"}>
        <h2 className="mb-2 text-lg font-semibold">From the teacher</h2>
        {summary ? (
          <p className="whitespace-pre-wrap">{summary}</p>
        ) : (
          <p className="no-print text-sm text-ink-soft">
            Write and save a summary above; it appears here and on the printed page.
          </p>
        )}
        <p className="mt-2 text-sm text-ink-soft">— {teacher}</p>
      </section>

      <section className="report-block">
        <h2 className="mb-2 text-lg font-semibold">Techniques gained</h2>
        <p className="text-sm">
          {p.gained.length
            ? `First used in this period: ${p.gained.map((t) => TECHNIQUE_WORDS[t].label).join(", ")}.`
            : "No technique appeared for the first time in this period."}
        </p>
        <div className="mt-3">
          <TechniqueTable
            totals={p.total.techniques}
            weeksUsed={p.weeksUsed}
            weekCount={p.weeks.length}
            gained={p.gained}
          />
        </div>
      </section>

      <section className="report-block grid gap-4 md:grid-cols-2 print:grid-cols-2">
        {(["score", "smoothness"] as const).map((m) => (
          <figure key={m}>
            <figcaption className="mb-1 text-sm font-semibold">{METRICS[m].label} per week</figcaption>
            <div aria-hidden="true">
              {/* A fixed width that fits an A4 or Letter page two to a row: print layout does not wait for resize observers. */}
              <ProgressLines data={p.charts[m]} height={200} width={340} />
            </div>
            <ChartTable hidden data={p.charts[m]} caption={`${METRICS[m].label} per week, ${from} to ${to}`} />
          </figure>
        ))}
      </section>

      {p.exercises.length ? (
        <section className="report-block">
          <h2 className="mb-2 text-lg font-semibold">Exercises</h2>
          <ul className="divide-y divide-line text-sm">
            {p.exercises.map((e) => (
              <li key={e.exerciseId ?? "free"} className="flex flex-wrap justify-between gap-2 py-1.5">
                <span className="font-semibold">{e.title}</span>
                <span>
                  {e.takes} take{e.takes === 1 ? "" : "s"} · score {formatMetric("score", e.score)} · accuracy{" "}
                  {formatMetric("accuracy", e.accuracy)}
                </span>
              </li>
            ))}
          </ul>
        </section>
      ) : null}

      <section>
        <h2 className="mb-2 text-lg font-semibold">Week by week</h2>
        <WeeklyFiguresTable weeks={p.weeks} total={p.total} caption={`${student}'s figures per week`} />
      </section>

      <footer className="report-block border-t border-line pt-3 text-xs text-ink-soft">
        Smoothness compares the smallest possible hand movement between chords with the movement played (100% is as
        smooth as possible). Nearnote's figures are practice aids, not an assessment of musicianship. Long practice can
        strain hands and wrists: short breaks help, and pain is a reason to see a qualified teacher or clinician.
      </footer>
    </article>
  );
}
