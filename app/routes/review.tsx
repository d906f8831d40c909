import { data, Form, Link, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/review";
import { deny, isTeacherOfTake, requireTakeAccess, requireTeacher } from "~/auth/access.server";
import { Button } from "~/components/Button";
import { Card } from "~/components/Card";
import { EmptyState } from "~/components/EmptyState";
import { PageHeader } from "~/components/PageHeader";
import { FLAG_TITLES } from "~/lib/explainFlags";
import { flashHeader } from "~/lib/flash.server";
import { pretty, timeLabel } from "~/lib/noteText";
import type { FlagName } from "~/analysis/types";
import { applyReviewIntent, reviewIntentSchema, reviewQueue, reviewQueueCount } from "~/models/feedback.server";

export const meta: Route.MetaFunction = () => [{ title: "Review · Nearnote" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireTeacher(request);
  const url = new URL(request.url);
  return { queue: reviewQueue(user.active.studioId), total: reviewQueueCount(user.active.studioId), undo: url.searchParams.get("undo") };
}

export async function action({ request }: Route.ActionArgs) {
  await requireTeacher(request);
  const form = await request.formData();
  const intent = reviewIntentSchema.safeParse(form.get("intent"));
  const takeId = String(form.get("takeId") ?? "");
  if (!takeId || !intent.success) return data({ error: "Choose a take." }, { status: 400 });
  const { user, take } = await requireTakeAccess(request, takeId);
  if (!isTeacherOfTake(user, take)) deny("page", "This take is not from your studio.");
  const message = applyReviewIntent(intent.data, take.id, user.id);
  // After "review" the undo button stays on the page until the next action.
  return redirect(intent.data === "review" ? `/review?undo=${take.id}` : "/review", {
    headers: { "Set-Cookie": await flashHeader(request, { tone: intent.data === "review" ? "success" : "info", message }) },
  });
}

function flagList(flags: Record<string, number> | null) {
  if (!flags) return [];
  return Object.entries(flags)
    .filter(([, n]) => n > 0)
    .map(([f, n]) => `${FLAG_TITLES[f as FlagName] ?? f} ×${n}`);
}

export default function Review({ loaderData }: Route.ComponentProps) {
  const { queue, total, undo } = loaderData;
  const navigation = useNavigation();
  return (
    <div className="flex flex-col gap-6">
      <PageHeader title="Review" lead="Takes no teacher has marked reviewed yet, newest first. Opening a take does not mark it: press Reviewed when you are done." />
      {undo ? (
        <Form method="post" className="flex items-center gap-3 rounded-md border border-line bg-card px-4 py-2 text-sm">
          <span>One take left the queue.</span>
          <input type="hidden" name="intent" value="unreview" />
          <input type="hidden" name="takeId" value={undo} />
          <Button variant="quiet">Undo</Button>
        </Form>
      ) : null}
      {queue.length === 0 ? (
        <EmptyState title="Nothing to review">New takes from your students appear here as they arrive.</EmptyState>
      ) : (
        <Card title={`${total} take${total === 1 ? "" : "s"} to review${total > queue.length ? ` (the newest ${queue.length} shown)` : ""}`}>
          <table className="w-full text-sm" data-testid="review-queue">
            <thead>
              <tr className="border-b border-line text-left text-ink-soft">
                <th scope="col" className="py-2 pr-3">Recorded</th>
                <th scope="col" className="py-2 pr-3">Student</th>
                <th scope="col" className="py-2 pr-3">Exercise</th>
                <th scope="col" className="py-2 pr-3">Key</th>
                <th scope="col" className="py-2 pr-3">Score</th>
                <th scope="col" className="py-2 pr-3">Flags</th>
                <th scope="col" className="py-2"><span className="sr-only">Actions</span></th>
              </tr>
            </thead>
            <tbody>
              {queue.map((t) => (
                <tr key={t.id} className="border-b border-line/60 align-top">
                  <td className="py-2 pr-3 whitespace-nowrap" title={`Arrived ${timeLabel(t.createdAt)}`}>{timeLabel(t.recordedAt)}</td>
                  <td className="py-2 pr-3">{t.studentName}</td>
                  <td className="py-2 pr-3">
                    <Link to={`/takes/${t.id}`} className="text-tide-dark hover:underline">{t.exerciseTitle ?? "Free practice"}</Link>
                  </td>
                  <td className="py-2 pr-3">{t.key ? pretty(t.key) : "–"}</td>
                  <td className="py-2 pr-3">{t.score !== null ? Math.round(t.score) : t.status === "failed" ? "failed" : "–"}</td>
                  <td className="py-2 pr-3 text-xs">{flagList(t.flags).join(", ") || <span className="text-ink-soft">none</span>}</td>
                  <td className="py-2">
                    <Form method="post">
                      <input type="hidden" name="intent" value="review" />
                      <input type="hidden" name="takeId" value={t.id} />
                      <Button variant="secondary" pending={navigation.formData?.get("takeId") === t.id}>Reviewed</Button>
                    </Form>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </Card>
      )}
    </div>
  );
}
