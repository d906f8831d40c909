import { Link, redirect } from "react-router";
import { eq } from "drizzle-orm";
import type { Route } from "./+types/students.$studentId";
import { requireStudentOfTeacher } from "~/auth/access.server";
import { PeriodForm } from "~/components/board/PeriodForm";
import { ChartTable, ProgressLines } from "~/components/board/ProgressChart";
import { RouteErrorBoundary } from "~/components/RouteErrorBoundary";
import { TechniqueTable } from "~/components/board/TechniqueTable";
import { WeeklyFiguresTable } from "~/components/board/WeeklyFiguresTable";
import { ButtonLink } from "~/components/Button";
import { Card } from "~/components/Card";
import { DataTable } from "~/components/DataTable";
import { EmptyState } from "~/components/EmptyState";
import { PageHeader } from "~/components/PageHeader";
import { Pager } from "~/components/Pager";
import { db } from "~/db/client.server";
import { users } from "~/db/schema";
import { formatMetric } from "~/utils/progressFigures";
import { studioTimeZone } from "~/models/progress.server";
import { parseProgressQuery } from "~/models/progressQuery.server";
import { studentProgress } from "~/models/studentProgress.server";
import { readTakeListQuery, studentTakesPage } from "~/models/takeList.server";
import { pagerLinks } from "~/utils/listLinks";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `${data?.student.name ?? "Student"} · Progress · Nearnote` },
];

export async function loader({ request, params, context, url }: Route.LoaderArgs) {
  const { user, membership } = await requireStudentOfTeacher({ request, context }, params.studentId);
  const studioId = user.active.studioId;
  const parsed = parseProgressQuery(new URL(request.url), studioTimeZone(studioId));
  if (!parsed.ok) throw redirect(`/students/${params.studentId}`);
  const q = parsed.query;
  const student = db()
    .select({ id: users.id, name: users.name, email: users.email })
    .from(users)
    .where(eq(users.id, params.studentId))
    .get()!;
  // The takes a page at a time, newest first; the pages keep the period chosen above.
  const takes = studentTakesPage(student.id, studioId, {
    ...readTakeListQuery(url.searchParams),
    sort: "date",
    dir: "desc",
  });
  return {
    timeZone: studioTimeZone(studioId),
    student,
    removed: membership.status === "removed",
    from: q.from,
    to: q.to,
    ...studentProgress(studioId, student, q.fromWeek, q.toWeek),
    takes: takes.rows,
    takesTotal: takes.total,
    takesPager: pagerLinks(url, takes.page, takes.pages, "#takes-heading"),
  };
}

export default function StudentProgress({ loaderData: d }: Route.ComponentProps) {
  const period = `${d.from} to ${d.to}`;
  const reportHref = `/reports/${d.student.id}?from=${d.from}&to=${d.to}`;
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title={d.student.name}
        lead={`${d.student.email}${d.removed ? " · removed from the studio" : ""} · progress from ${period}`}
        actions={
          <>
            <ButtonLink to="/board" variant="quiet">
              Board
            </ButtonLink>
            <ButtonLink to={reportHref}>Printable report</ButtonLink>
          </>
        }
      />
      <PeriodForm from={d.from} to={d.to} />
      {d.total.takes === 0 ? (
        <EmptyState title="No takes in this period">
          Choose a longer period above, or send a reminder from the board.
        </EmptyState>
      ) : null}
      <div className="grid gap-6 md:grid-cols-2">
        <Card title="Mean score per week">
          <div aria-hidden="true">
            <ProgressLines data={d.charts.score} height={220} />
          </div>
          <details className="mt-2 text-sm">
            <summary className="cursor-pointer text-tide-dark">As a table</summary>
            <ChartTable data={d.charts.score} caption={`Mean score per week, ${period}`} />
          </details>
        </Card>
        <Card title="Smoothness per week">
          <div aria-hidden="true">
            <ProgressLines data={d.charts.smoothness} height={220} />
          </div>
          <details className="mt-2 text-sm">
            <summary className="cursor-pointer text-tide-dark">As a table</summary>
            <ChartTable data={d.charts.smoothness} caption={`Smoothness per week, ${period}`} />
          </details>
        </Card>
      </div>
      <section aria-labelledby="weeks-heading" className="flex flex-col gap-3">
        <h2 id="weeks-heading" className="text-lg font-semibold">
          Week by week
        </h2>
        <WeeklyFiguresTable
          weeks={d.weeks}
          total={d.total}
          caption={`${d.student.name}'s figures per week, ${period}`}
        />
      </section>
      <div className="grid gap-6 md:grid-cols-2">
        <Card title="Techniques">
          <TechniqueTable
            totals={d.total.techniques}
            weeksUsed={d.weeksUsed}
            weekCount={d.weeks.length}
            gained={d.gained}
          />
        </Card>
        <Card title="Per exercise">
          {d.exercises.length === 0 ? (
            <p className="text-sm text-ink-soft">No takes in this period.</p>
          ) : (
            <ul className="divide-y divide-line text-sm">
              {d.exercises.map((e) => (
                <li key={e.exerciseId ?? "free"} className="flex flex-wrap justify-between gap-2 py-2">
                  <span className="font-semibold">{e.title}</span>
                  <span className="text-ink-soft">
                    {e.takes} take{e.takes === 1 ? "" : "s"} · score {formatMetric("score", e.score)} · smoothness{" "}
                    {formatMetric("smoothness", e.smoothness)} · accuracy {formatMetric("accuracy", e.accuracy)}
                  </span>
                </li>
              ))}
            </ul>
          )}
        </Card>
      </div>
      <section aria-labelledby="takes-heading" className="flex flex-col gap-3">
        <h2 id="takes-heading" className="text-lg font-semibold">
          Takes <span className="text-sm font-normal text-ink-soft">({d.takesTotal})</span>
        </h2>
        <DataTable
          caption={`${d.student.name}'s takes, newest first`}
          isEmpty={d.takes.length === 0}
          empty={
            <EmptyState title="No takes yet">Takes appear here as soon as {d.student.name} uploads one.</EmptyState>
          }
          head={
            <tr>
              <th className="px-4 py-2">Recorded ({d.timeZone})</th>
              <th className="px-4 py-2">Exercise</th>
              <th className="px-4 py-2 text-right">Score</th>
              <th className="px-4 py-2 text-right">Smoothness</th>
              <th className="px-4 py-2 text-right">Accuracy</th>
            </tr>
          }
        >
          {d.takes.map((t) => (
            <tr key={t.id}>
              <td className="px-4 py-2">
                <Link to={`/takes/${t.id}`} className="text-tide-dark hover:underline">
                  {new Date(t.recordedAt).toLocaleString("en-GB", {
                    dateStyle: "medium",
                    timeStyle: "short",
                    timeZone: d.timeZone,
                  })}
                </Link>
              </td>
              <td className="px-4 py-2">
                {t.status === "failed" ? (
                  <span className="text-brick">Could not be analysed</span>
                ) : (
                  (t.exerciseTitle ?? "Free practice")
                )}
              </td>
              <td className="px-4 py-2 text-right tabular-nums">{formatMetric("score", t.score)}</td>
              <td className="px-4 py-2 text-right tabular-nums">{formatMetric("smoothness", t.smoothness)}</td>
              <td className="px-4 py-2 text-right tabular-nums">{formatMetric("accuracy", t.accuracy)}</td>
            </tr>
          ))}
        </DataTable>
        <Pager links={d.takesPager} label={`Pages of ${d.student.name}'s takes`} />
      </section>
    </div>
  );
}

export const ErrorBoundary = RouteErrorBoundary;
