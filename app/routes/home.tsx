import { eq } from "drizzle-orm";
import type { Route } from "./+types/home";
import { requireUser } from "~/auth/access.server";
import { Card } from "~/components/Card";
import { StudentHome } from "~/components/home/StudentHome";
import { ButtonLink } from "~/components/Button";
import { UnreadFeedback } from "~/components/feedback/UnreadFeedback";
import { PageHeader } from "~/components/PageHeader";
import { db } from "~/db/client.server";
import { studios } from "~/db/schema";
import { localDate } from "~/lib/weeks";
import { reviewQueueCount, unreadFeedback } from "~/models/feedback.server";
import { listExercisesForStudent, listTakesForStudent, weeklyFiguresForStudent } from "~/models/takes.server";

export const meta: Route.MetaFunction = () => [{ title: "Home · Nearnote" }];

/** Today's date (YYYY-MM-DD) where the studio is, so "due today" means the studio's today. */
function studioToday(studioId: string): string {
  const timeZone = db().select({ tz: studios.timeZone }).from(studios).where(eq(studios.id, studioId)).get()?.tz ?? "UTC";
  const d = localDate(new Date(), timeZone);
  return `${d.year}-${String(d.month).padStart(2, "0")}-${String(d.day).padStart(2, "0")}`;
}

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const active = user.active;
  const student =
    active?.role === "student"
      ? {
          exercises: listExercisesForStudent(user.id, active.studioId),
          takes: listTakesForStudent(user.id, { studioId: active.studioId, limit: 50 }),
          weeks: weeklyFiguresForStudent(user.id, active.studioId),
          today: studioToday(active.studioId),
          unread: unreadFeedback(user.id, active.studioId),
        }
      : null;
  const teacher = active && active.role !== "student" ? { toReview: reviewQueueCount(active.studioId) } : null;
  return { name: user.name, active, studios: user.studios, student, teacher };
}

export default function Home({ loaderData }: Route.ComponentProps) {
  const { name, active, student, teacher } = loaderData;
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title={`Hello, ${name.split(" ")[0]}`}
        lead={active ? `${active.studioName} · ${active.role === "student" ? "student" : "teacher"}` : "You are not in a studio yet."}
      />
      {student ? <UnreadFeedback items={student.unread} /> : null}
      {teacher ? (
        <Card title="Review" data-testid="review-count">
          <div className="flex flex-wrap items-center justify-between gap-3">
            <p>
              {teacher.toReview === 0 ? "Every take has been reviewed." : `${teacher.toReview} take${teacher.toReview === 1 ? "" : "s"} waiting for your review.`}
            </p>
            <ButtonLink to="/review" variant={teacher.toReview ? "primary" : "secondary"}>
              Open the review queue
            </ButtonLink>
          </div>
        </Card>
      ) : null}
      {student ? (
        <StudentHome exercises={student.exercises} takes={student.takes} weeks={student.weeks} today={student.today} />
      ) : (
        <Card title="Your studio">
          <p className="text-ink-soft">Your students' takes and progress will appear here.</p>
        </Card>
      )}
    </div>
  );
}
