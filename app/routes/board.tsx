import { redirect, useNavigation } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/board";
import { requireStudentsOfTeacher, requireTeacher } from "~/auth/access.server";
import { BoardTable } from "~/components/board/BoardTable";
import { ChartPanel } from "~/components/board/ChartPanel";
import { ReminderCard } from "~/components/board/ReminderCard";
import { WeekPicker } from "~/components/board/WeekPicker";
import { RouteErrorBoundary } from "~/components/RouteErrorBoundary";
import { ButtonLink } from "~/components/Button";
import { EmptyState } from "~/components/EmptyState";
import { PageHeader } from "~/components/PageHeader";
import { parseForm, readForm, redirectWithFlash } from "~/forms/forms.server";
import { shiftWeek, weekEnd, weekLabel } from "~/utils/progressFigures";
import { weekStart } from "~/utils/weeks";
import { boardRows, chartData, pickStudents } from "~/models/board.server";
import { boardTable } from "~/models/boardTable.server";
import { currentWeek, studioTimeZone } from "~/models/progress.server";
import { parseProgressQuery } from "~/models/progressQuery.server";
import { sendPracticeReminders } from "~/models/reminders.server";

/** How many students the chart shows before the teacher picks: more lines than this stop being readable. */
const DEFAULT_CHART_STUDENTS = 6;
/** Weeks the table can look back on (a Monday-morning teacher wants last week's figures). */
const WEEK_CHOICES = 12;

export const meta: Route.MetaFunction = () => [{ title: "Progress board · Nearnote" }];

export async function loader({ request, context, url: pageUrl }: Route.LoaderArgs) {
  const teacher = await requireTeacher({ request, context });
  const studioId = teacher.active.studioId;
  const timeZone = studioTimeZone(studioId);
  const url = new URL(request.url);
  const parsed = parseProgressQuery(url, timeZone);
  // A hand-edited address with a bad value falls back to the default view rather than an error page.
  if (!parsed.ok) throw redirect("/board");
  const query = parsed.query;
  await requireStudentsOfTeacher({ request, context }, query.studentIds);
  const current = currentWeek(studioId);
  const weekOptions = Array.from({ length: WEEK_CHOICES }, (_, i) => shiftWeek(current, -i));
  const chosen = url.searchParams.get("week");
  if (chosen !== null && !weekOptions.includes(chosen)) throw redirect("/board");
  const { week, rows } = boardRows(studioId, new Date(), chosen ?? current);
  const chosenIds = query.studentIds.length
    ? query.studentIds
    : rows.slice(0, DEFAULT_CHART_STUDENTS).map((r) => r.studentId);
  const chart = chosenIds.length
    ? chartData(studioId, query.metric, pickStudents(studioId, chosenIds), query.fromWeek, query.toWeek)
    : null;
  return {
    studioName: teacher.active.studioName,
    timeZone,
    week: { key: week, start: weekStart(week), end: weekEnd(week), isCurrent: week === current },
    weekOptions: weekOptions.map((key, i) => ({
      key,
      label: i === 0 ? "This week" : i === 1 ? "Last week" : `Week of ${weekLabel(key)}`,
    })),
    // The table a page at a time (filtered and sorted as the address says); the chart's
    // choices and the reminder read every student.
    table: boardTable(rows, pageUrl),
    students: rows.map((r) => ({ id: r.studentId, name: r.name })),
    choice: { metric: query.metric, studentIds: chosenIds, from: query.from, to: query.to },
    chart: chart && { ...chart, from: query.from, to: query.to },
    quiet:
      week !== current
        ? []
        : rows
            .filter((r) => r.thisWeek.takes === 0)
            .map((r) => ({ id: r.studentId, name: r.name, reminded: r.remindedThisWeek })),
  };
}

const actionSchema = z.object({ intent: z.literal("remind") });

export async function action({ request, context }: Route.ActionArgs) {
  const teacher = await requireTeacher({ request, context });
  const parsed = parseForm(actionSchema, await readForm(request));
  if (!parsed.ok) return parsed.response;
  const { sent, alreadyReminded } = await sendPracticeReminders(
    { id: teacher.active.studioId, name: teacher.active.studioName },
    { id: teacher.id, name: teacher.name },
  );
  const message = sent.length
    ? `Reminder sent to ${sent.join(", ")}.`
    : alreadyReminded
      ? "Everyone without a take this week has already had a reminder."
      : "Everyone has recorded a take this week: no reminder needed.";
  const back = new URL(request.url);
  return redirectWithFlash(`/board${back.search}`, message, request, { tone: sent.length ? "success" : "info" });
}

export default function Board({ loaderData }: Route.ComponentProps) {
  const navigation = useNavigation();
  const { table, week, weekOptions, chart, choice, students, quiet, timeZone } = loaderData;
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Progress board"
        lead={`${week.isCurrent ? "This week" : "The week"} of ${week.start} to ${week.end} (${timeZone}) for every student, with the change since the week before.`}
        actions={
          <ButtonLink to="/studio/settings" variant="quiet">
            Studio time zone
          </ButtonLink>
        }
      />
      {table.total === 0 ? (
        <EmptyState title="No students yet" action={<ButtonLink to="/students">Invite students</ButtonLink>}>
          The board fills in as soon as your students join and upload their first takes. Invite them from the Students
          page: each gets a link to set a password.
        </EmptyState>
      ) : (
        <>
          <ReminderCard
            quiet={quiet}
            pending={navigation.state === "submitting" && navigation.formData?.get("intent") === "remind"}
          />
          <WeekPicker week={week.key} options={weekOptions} />
          <BoardTable table={table} timeZone={timeZone} />
          {chart ? <ChartPanel students={students} choice={choice} data={chart} /> : null}
          <p className="text-xs text-ink-soft">
            Smoothness is the best possible motion divided by the motion played, summed over the week. Status compares
            the mean score of the three weeks before with the last three weeks (this one included), and needs 3 points
            either way to say improving or slipping; a student without a take this week gets no trend status. These
            figures are practice aids for your judgement, not grades.
          </p>
        </>
      )}
    </div>
  );
}

export const ErrorBoundary = RouteErrorBoundary;
