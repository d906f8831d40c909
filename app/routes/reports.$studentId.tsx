import { eq } from "drizzle-orm";
import { data, redirect, useNavigation } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/reports.$studentId";
import { requireStudentOfTeacher } from "~/auth/access.server";
import { PeriodForm } from "~/components/board/PeriodForm";
import { ReportControls } from "~/components/board/ReportControls";
import { ReportSheet } from "~/components/board/ReportSheet";
import { RouteErrorBoundary } from "~/components/RouteErrorBoundary";
import "~/components/board/report.css";
import { db } from "~/db/client.server";
import { users } from "~/db/schema";
import { formFailure, parseForm, readForm, redirectWithFlash } from "~/forms/forms.server";
import { studioTimeZone } from "~/models/progress.server";
import { isoDate, parseProgressQuery } from "~/models/progressQuery.server";
import { getProgressReport, listProgressReports, saveProgressReport } from "~/models/progressReports.server";
import { studentProgress } from "~/models/studentProgress.server";

export const meta: Route.MetaFunction = ({ data }) => [
  {
    title: data
      ? `Progress report: ${data.student.name}, ${data.from} to ${data.to} · Nearnote`
      : "Progress report · Nearnote",
  },
];

export async function loader({ request, params, context }: Route.LoaderArgs) {
  const { user } = await requireStudentOfTeacher({ request, context }, params.studentId);
  const studioId = user.active.studioId;
  const url = new URL(request.url);
  const reportId = url.searchParams.get("report");
  const saved = reportId ? getProgressReport(studioId, params.studentId, reportId) : undefined;
  if (reportId && !saved) throw data("There is no such report for this student.", { status: 404 });
  if (saved) {
    url.searchParams.set("from", saved.fromDate);
    url.searchParams.set("to", saved.toDate);
  }
  const parsed = parseProgressQuery(url, studioTimeZone(studioId));
  if (!parsed.ok) throw redirect(`/reports/${params.studentId}`);
  const q = parsed.query;
  const student = db()
    .select({ id: users.id, name: users.name })
    .from(users)
    .where(eq(users.id, params.studentId))
    .get()!;
  return {
    student,
    studioName: user.active.studioName,
    teacherName: user.name,
    from: q.from,
    to: q.to,
    saved: saved ? { id: saved.id, summary: saved.summary, createdAt: saved.createdAt.toISOString() } : null,
    savedReports: listProgressReports(studioId, student.id),
    progress: studentProgress(studioId, student, q.fromWeek, q.toWeek),
  };
}

const saveSchema = z.object({
  intent: z.literal("save"),
  from: isoDate,
  to: isoDate,
  summary: z
    .string()
    .trim()
    .min(1, "Write a few words for the student first")
    .max(5000, "Keep the summary under 5,000 characters"),
});

export async function action({ request, params, context }: Route.ActionArgs) {
  const { user } = await requireStudentOfTeacher({ request, context }, params.studentId);
  const form = await readForm(request);
  const parsed = parseForm(saveSchema, form);
  if (!parsed.ok) return parsed.response;
  const { from, to, summary } = parsed.data;
  if (from > to) return formFailure({ form, fieldErrors: { to: "The period must end after it starts" } });
  const report = saveProgressReport({
    studioId: user.active.studioId,
    studentId: params.studentId,
    fromDate: from,
    toDate: to,
    summary,
    createdById: user.id,
  });
  return redirectWithFlash(
    `/reports/${params.studentId}?report=${report.id}`,
    "Report saved. Print it or save it as a PDF from the browser.",
    request,
  );
}

export default function Report({ loaderData: d, actionData }: Route.ComponentProps) {
  const navigation = useNavigation();
  return (
    <div className="flex flex-col gap-6">
      <div className="no-print flex flex-col gap-4">
        <PeriodForm from={d.from} to={d.to} label="Change period" />
        <ReportControls
          studentId={d.student.id}
          from={d.from}
          to={d.to}
          saved={d.saved}
          savedReports={d.savedReports}
          errors={actionData?.fieldErrors}
          pending={navigation.state === "submitting"}
        />
      </div>
      <ReportSheet
        student={d.student.name}
        studio={d.studioName}
        teacher={d.teacherName}
        from={d.from}
        to={d.to}
        summary={d.saved?.summary ?? null}
        progress={d.progress}
      />
    </div>
  );
}

export const ErrorBoundary = RouteErrorBoundary;
