// Feedback on one take, posted from the take page: comments and replies, flags marked as
// intended, reviewed / not reviewed. A route of its own, so the take page's own actions stay
// as they are; every answer sends the browser back to the take (or where `back` says).
import { data, redirect } from "react-router";
import type { Route } from "./+types/takes.$takeId.feedback";
import { deny, isTeacherOfTake, requireSameOrigin, requireTakeAccess } from "~/auth/access.server";
import { safeRedirect } from "~/auth/session.server";
import { flashHeader } from "~/lib/flash.server";
import { sendFeedbackNotice } from "~/models/digest.server";
import {
  addComment,
  applyReviewIntent,
  commentSchema,
  FeedbackRefused,
  intendSchema,
  markIntended,
  unmarkIntended,
} from "~/models/feedback.server";

export async function loader({ request, params, context }: Route.LoaderArgs) {
  const { take } = await requireTakeAccess({ request, context }, params.takeId);
  return redirect(`/takes/${take.id}`);
}

/** A resource route that changes data: it checks the origin itself. */
export async function action({ request, params, context }: Route.ActionArgs) {
  requireSameOrigin(request);
  const { user, take } = await requireTakeAccess({ request, context }, params.takeId);
  const form = await request.formData();
  const intent = String(form.get("intent") ?? "");
  const asTeacher = isTeacherOfTake(user, take);
  const back = safeRedirect(form.get("back"), `/takes/${take.id}`);
  const done = async (message: string, anchor = "") =>
    redirect(`${back}${anchor}`, { headers: { "Set-Cookie": await flashHeader(request, { tone: "success", message }) } });
  const fail = (message: string, status = 400) => data({ error: { intent, message } }, { status });
  const teacherOnly = () => {
    if (!asTeacher) deny("page", "Only the studio's teachers can do this.");
  };

  try {
    switch (intent) {
      case "comment": {
        const parsed = commentSchema.safeParse({
          body: form.get("body") ?? "",
          changeIdx: form.get("changeIdx") ?? undefined,
          parentId: form.get("parentId") ?? undefined,
        });
        if (!parsed.success) return fail(parsed.error.issues[0].message);
        // Teachers start threads; the student who played the take replies to them.
        if (!asTeacher && (user.id !== take.studentId || !parsed.data.parentId)) deny("page", "Only a reply to your teacher is possible here.");
        const id = addComment({ takeId: take.id, authorId: user.id, ...parsed.data });
        await sendFeedbackNotice(id).catch((e) => console.error("[nearnote] feedback mail failed:", e));
        const anchor = parsed.data.changeIdx === null ? "#feedback" : `#change-${parsed.data.changeIdx}`;
        return done(parsed.data.parentId ? "Reply posted." : "Comment posted.", anchor);
      }
      case "intend": {
        teacherOnly();
        const parsed = intendSchema.safeParse(Object.fromEntries(form));
        if (!parsed.success) return fail(parsed.error.issues[0].message);
        markIntended(take.id, user.id, parsed.data);
        return done("Marked as intended: this flag no longer counts against the score.");
      }
      case "unintend": {
        teacherOnly();
        unmarkIntended(take.id, String(form.get("markId") ?? ""));
        return done("The flag counts again.");
      }
      case "review":
      case "unreview": {
        teacherOnly();
        return done(applyReviewIntent(intent, take.id, user.id));
      }
      default:
        return fail("Unknown action.");
    }
  } catch (e) {
    if (e instanceof FeedbackRefused) return fail(e.message);
    throw e;
  }
}
