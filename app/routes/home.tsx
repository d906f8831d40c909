import { Suspense } from "react";
import type { Route } from "./+types/home";
import { requireUser } from "~/auth/access.server";
import { Card } from "~/components/Card";
import { StudentHome, takesTable, weeklyChart } from "~/components/home/StudentHome";
import { lazyInPlace } from "~/components/lazyInPlace";
import { PageHeader } from "~/components/PageHeader";
import { reviewQueueCount, unreadFeedback } from "~/models/feedback.server";
import { studioTimeZone } from "~/models/progress.server";
import { dayLabel, pretty } from "~/utils/plainText";
import { todayIn } from "~/models/progressQuery.server";
import { studentExercises } from "~/models/exercises.server";
import { teacherWeek } from "~/models/teacherHome.server";
import { weeklyFiguresForStudent } from "~/models/takes.server";
import { studentTakeList } from "~/models/takeList.server";

// A student's home never shows the teacher's week, so in the browser its code loads on its
// own, for teachers only (hydrating the server's HTML once it is there); the loader has it
// loaded on the server first, so the page arrives whole and works without scripts.
const { Component: TeacherHome, preload: loadTeacherHome } = lazyInPlace(() =>
  import("~/components/home/TeacherHome").then((m) => m.TeacherHome),
);
// Likewise the new-feedback card, only for a student who has some.
const { Component: UnreadFeedback, preload: loadUnreadFeedback } = lazyInPlace(() =>
  import("~/components/feedback/UnreadFeedback").then((m) => m.UnreadFeedback),
);

export const meta: Route.MetaFunction = () => [{ title: "Home · Nearnote" }];

export async function loader({ request, context, url }: Route.LoaderArgs) {
  const user = await requireUser({ request, context });
  const active = user.active;
  const zone = active ? studioTimeZone(active.studioId) : "UTC";
  const student =
    active?.role === "student"
      ? {
          // Ordered and marked done, overdue or due as on the list of exercises.
          exercises: studentExercises(user.id, active.studioId).exercises.map((e) => ({
            ...e,
            progressionText: pretty(e.progression),
            keysText: e.keys.map(pretty).join(", "),
            dueLabel: e.dueDate ? dayLabel(`${e.dueDate}T12:00:00Z`) : null,
          })),
          // One page of the takes, in the order the address asks for (newest first by default), days as
          // the studio's calendar has them (a take late at night belongs to that night).
          takes: studentTakeList(user.id, active.studioId, url, zone),
          weeks: weeklyFiguresForStudent(user.id, active.studioId),
          // The studio's today (YYYY-MM-DD), so "due today" means the same day for everyone in it.
          today: todayIn(zone),
          unread: unreadFeedback(user.id, active.studioId),
        }
      : null;
  const teacher =
    active && active.role !== "student"
      ? {
          toReview: reviewQueueCount(active.studioId),
          week: teacherWeek(active.studioId, { id: user.id, emailVerified: user.emailVerified }),
        }
      : null;
  // The parts loaded on their own in the browser are loaded here first, so the HTML carries them.
  if (student)
    await Promise.all([
      weeklyChart.preload(),
      student.takes.total ? takesTable.preload() : null,
      student.unread.length ? loadUnreadFeedback() : null,
    ]);
  if (teacher) await loadTeacherHome();
  return { name: user.name, active, studios: user.studios, student, teacher };
}

export default function Home({ loaderData }: Route.ComponentProps) {
  const { name, active, student, teacher } = loaderData;
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title={`Hello, ${name.split(" ")[0]}`}
        lead={
          active
            ? `${active.studioName} · ${active.role === "student" ? "student" : "teacher"}`
            : "You are not in a studio yet."
        }
      />
      {student?.unread.length ? (
        <Suspense fallback={null}>
          <UnreadFeedback items={student.unread} />
        </Suspense>
      ) : null}
      {student ? (
        <StudentHome exercises={student.exercises} takes={student.takes} weeks={student.weeks} today={student.today} />
      ) : teacher ? (
        <Suspense fallback={<p className="text-sm text-ink-soft">Loading your studio's week…</p>}>
          <TeacherHome week={teacher.week} toReview={teacher.toReview} />
        </Suspense>
      ) : (
        <Card title="Your studio">
          <p className="text-ink-soft">Your students' takes and progress will appear here.</p>
        </Card>
      )}
    </div>
  );
}
