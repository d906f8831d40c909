import type { Route } from "./+types/home";
import { requireUser } from "~/auth/access.server";
import { Card } from "~/components/Card";
import { StudentHome } from "~/components/home/StudentHome";
import { TeacherHome } from "~/components/home/TeacherHome";
import { UnreadFeedback } from "~/components/feedback/UnreadFeedback";
import { PageHeader } from "~/components/PageHeader";
import { reviewQueueCount, unreadFeedback } from "~/models/feedback.server";
import { studioTimeZone } from "~/models/progress.server";
import { studioShortDate } from "~/utils/studioTime";
import { todayIn } from "~/models/progressQuery.server";
import { studentExercises } from "~/models/exercises.server";
import { teacherWeek } from "~/models/teacherHome.server";
import { listTakesForStudent, weeklyFiguresForStudent } from "~/models/takes.server";

export const meta: Route.MetaFunction = () => [{ title: "Home · Nearnote" }];

export async function loader({ request, context }: Route.LoaderArgs) {
  const user = await requireUser({ request, context });
  const active = user.active;
  const zone = active ? studioTimeZone(active.studioId) : "UTC";
  const student =
    active?.role === "student"
      ? {
          // Ordered and marked done, overdue or due as on the list of exercises.
          exercises: studentExercises(user.id, active.studioId).exercises,
          // Days as the studio's calendar has them (a take late at night belongs to that night).
          takes: listTakesForStudent(user.id, { studioId: active.studioId, limit: 50 }).map((t) => ({
            ...t,
            recordedDay: studioShortDate(t.recordedAt, zone),
          })),
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
      {student ? <UnreadFeedback items={student.unread} /> : null}
      {student ? (
        <StudentHome exercises={student.exercises} takes={student.takes} weeks={student.weeks} today={student.today} />
      ) : teacher ? (
        <TeacherHome week={teacher.week} toReview={teacher.toReview} />
      ) : (
        <Card title="Your studio">
          <p className="text-ink-soft">Your students' takes and progress will appear here.</p>
        </Card>
      )}
    </div>
  );
}
