import { Link } from "react-router";
import { ButtonLink } from "~/components/Button";
import { Card } from "~/components/Card";
import { dayLabel } from "~/utils/plainText";
import { studioDateTime, studioShortDate, zoneName } from "~/utils/studioTime";
import type { FirstRunStep, TeacherWeek } from "~/models/teacherHome.server";
import { dueWords } from "~/utils/exerciseState";

const STEP_TEXT: Record<FirstRunStep["id"], { title: string; todo: string; link: string; action: string }> = {
  "confirm-email": {
    title: "Confirm your e-mail address",
    todo: "Open the link we sent you, so students' replies and your weekly summary reach you.",
    link: "/settings",
    action: "Account settings",
  },
  "invite-students": {
    title: "Invite your students",
    todo: "Each gets a link to set a password and join the studio.",
    link: "/students",
    action: "Invite students",
  },
  "set-exercise": {
    title: "Set a first exercise",
    todo: "A progression in one or more keys, with a due date if you like.",
    link: "/exercises/new",
    action: "Set an exercise",
  },
};

function FirstRun({ steps }: { steps: FirstRunStep[] }) {
  const done = steps.filter((s) => s.done).length;
  return (
    <Card title="Getting your studio going" data-testid="first-run">
      <p className="mb-3 text-sm text-ink-soft">
        {done} of {steps.length} done. Each step ticks itself off once it has happened.
      </p>
      <ol className="flex flex-col gap-3">
        {steps.map((s, i) => {
          const t = STEP_TEXT[s.id];
          return (
            <li key={s.id} className="flex flex-wrap items-start justify-between gap-3" data-done={s.done || undefined}>
              <div className="flex min-w-0 items-start gap-3">
                <span
                  aria-hidden="true"
                  className={`mt-0.5 inline-flex h-6 w-6 shrink-0 items-center justify-center rounded-full text-sm font-semibold ${s.done ? "bg-moss text-white" : "border border-line bg-card text-ink-soft"}`}
                >
                  {s.done ? "✓" : i + 1}
                </span>
                <div className="min-w-0">
                  <p className={`font-semibold ${s.done ? "text-ink-soft line-through" : ""}`}>
                    {t.title}
                    <span className="sr-only">{s.done ? " (done)" : " (to do)"}</span>
                  </p>
                  {s.done ? null : <p className="text-sm text-ink-soft">{t.todo}</p>}
                </div>
              </div>
              {s.done ? null : (
                <ButtonLink to={t.link} variant="secondary">
                  {t.action}
                </ButtonLink>
              )}
            </li>
          );
        })}
      </ol>
    </Card>
  );
}

function lastTakeWords(iso: string | null, timeZone: string) {
  return iso ? `last take ${studioShortDate(iso, timeZone)}` : "no takes yet";
}

/** The teacher's week at a glance; every list links to where the work is done. */
export function TeacherHome({ week, toReview }: { week: TeacherWeek; toReview: number }) {
  const { timeZone } = week;
  return (
    <div className="flex flex-col gap-6">
      {week.firstRun ? <FirstRun steps={week.firstRun} /> : null}
      <div className="grid gap-6 md:grid-cols-2">
        <Card
          title="New takes"
          data-testid="new-takes"
          actions={
            <ButtonLink to="/review" variant={toReview ? "primary" : "secondary"}>
              Listen to takes
            </ButtonLink>
          }
        >
          <p className="mb-2 text-sm text-ink-soft">
            {week.newTakes.total === 0
              ? "No new takes"
              : `${week.newTakes.total} new take${week.newTakes.total === 1 ? "" : "s"}`}{" "}
            {week.since
              ? `since your last visit (${studioDateTime(week.since, timeZone)})`
              : "played in the last seven days"}
            {` · ${toReview} waiting to be heard`}
          </p>
          {week.newTakes.latest.length ? (
            <ul className="divide-y divide-line">
              {week.newTakes.latest.map((t) => (
                <li key={t.id} className="flex flex-wrap items-baseline justify-between gap-x-3 py-1.5 text-sm">
                  <Link to={`/takes/${t.id}`} className="font-semibold text-tide-dark hover:underline">
                    {t.studentName} · {t.exerciseTitle ?? "Free practice"}
                  </Link>
                  <time dateTime={t.recordedAt} className="whitespace-nowrap text-ink-soft">
                    {studioShortDate(t.recordedAt, timeZone)}
                  </time>
                </li>
              ))}
            </ul>
          ) : null}
        </Card>
        <Card title="Due in the next seven days" data-testid="due-soon">
          {week.dueSoon.length === 0 ? (
            <p className="text-sm text-ink-soft">Nothing falls due by {dayLabel(`${week.until}T00:00:00Z`)}.</p>
          ) : (
            <ul className="divide-y divide-line">
              {week.dueSoon.map((e) => (
                <li key={e.id} className="flex flex-wrap items-baseline justify-between gap-x-3 py-1.5 text-sm">
                  <Link to={`/exercises/${e.id}`} className="font-semibold text-tide-dark hover:underline">
                    {e.title}
                  </Link>
                  <span className="whitespace-nowrap text-ink-soft">
                    {dueWords(e.dueDate, week.today)} · {e.handedIn} of {e.setFor} students have a take
                  </span>
                </li>
              ))}
            </ul>
          )}
        </Card>
        <Card title="Not practised this week" data-testid="not-practised">
          {week.students === 0 ? (
            <p className="text-sm text-ink-soft">No students yet.</p>
          ) : week.notPractised.length === 0 ? (
            <p className="text-sm text-ink-soft">Every student has recorded a take this week.</p>
          ) : (
            <>
              <ul className="divide-y divide-line">
                {week.notPractised.map((s) => (
                  <li key={s.id} className="flex flex-wrap items-baseline justify-between gap-x-3 py-1.5 text-sm">
                    <Link to={`/students/${s.id}`} className="font-semibold text-tide-dark hover:underline">
                      {s.name}
                    </Link>
                    <span className="whitespace-nowrap text-ink-soft">{lastTakeWords(s.lastTakeAt, timeZone)}</span>
                  </li>
                ))}
              </ul>
              <p className="mt-2 text-sm">
                <Link to="/board" className="text-tide-dark underline">
                  Send a practice reminder from the board
                </Link>
              </p>
            </>
          )}
        </Card>
        <Card title="Dropped" data-testid="dropped">
          {week.dropped.length === 0 ? (
            <p className="text-sm text-ink-soft">
              Nobody's mean score fell by 3 points or more over the last three weeks.
            </p>
          ) : (
            <ul className="divide-y divide-line">
              {week.dropped.map((s) => (
                <li key={s.id} className="flex flex-wrap items-baseline justify-between gap-x-3 py-1.5 text-sm">
                  <Link to={`/students/${s.id}`} className="font-semibold text-tide-dark hover:underline">
                    {s.name}
                  </Link>
                  <span className="whitespace-nowrap text-ink-soft">
                    mean score {s.compare?.before} → {s.compare?.recent}
                  </span>
                </li>
              ))}
            </ul>
          )}
          <p className="mt-2 text-xs text-ink-soft">
            Mean score of the three weeks before against the last three weeks. A practice aid, not a verdict.
          </p>
        </Card>
      </div>
      <p className="text-xs text-ink-soft">Dates and times in the studio's time zone ({zoneName(timeZone)}).</p>
    </div>
  );
}
