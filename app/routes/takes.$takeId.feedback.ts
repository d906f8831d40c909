// Feedback on one take, posted from the take page: comments and replies, flags marked as
// intended, reviewed / not reviewed. A route of its own, so the take page's own actions stay
// as they are; every answer sends the browser back to the take (or where `back` says).
import { redirect } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/takes.$takeId.feedback";
import { deny, isTeacherOfTake, requireSameOrigin, requireTakeAccess } from "~/auth/access.server";
import { safeRedirect } from "~/auth/session.server";
import { formFailure, parseForm, readForm, redirectWithFlash } from "~/forms/forms.server";
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

const actionSchema = z.discriminatedUnion("intent", [
  commentSchema.extend({ intent: z.literal("comment"), body: z.string().default("").pipe(commentSchema.shape.body) }),
  intendSchema.extend({ intent: z.literal("intend") }),
  z.object({ intent: z.literal("unintend"), markId: z.string().default("") }),
  z.object({ intent: z.enum(["review", "unreview"]) }),
]);

/** A resource route that changes data: it checks the origin itself. */
export async function action({ request, params, context }: Route.ActionArgs) {
  requireSameOrigin(request);
  const { user, take } = await requireTakeAccess({ request, context }, params.takeId);
  const form = await readForm(request);
  const asTeacher = isTeacherOfTake(user, take);
  const back = safeRedirect(form.get("back"), `/takes/${take.id}`);
  const done = (message: string, anchor = "") => redirectWithFlash(`${back}${anchor}`, message, request);
  const teacherOnly = () => {
    if (!asTeacher) deny("page", "Only the studio's teachers can do this.");
  };
  const parsed = parseForm(actionSchema, form);
  if (!parsed.ok) return parsed.response;
  const input = parsed.data;

  try {
    switch (input.intent) {
      case "comment": {
        const { body, changeIdx, parentId } = input;
        // Teachers start threads; the student who played the take replies to them.
        if (!asTeacher && (user.id !== take.studentId || !parentId))
          deny("page", "Only a reply to your teacher is possible here.");
        const id = addComment({ takeId: take.id, authorId: user.id, body, changeIdx, parentId });
        await sendFeedbackNotice(id).catch((e) => console.error("[nearnote] feedback mail failed:", e));
        const anchor = changeIdx === null ? "#feedback" : `#change-${changeIdx}`;
        return done(parentId ? "Reply posted." : "Comment posted.", anchor);
      }
      case "intend": {
        teacherOnly();
        const { intent: _intent, ...mark } = input;
        markIntended(take.id, user.id, mark);
        return done("Marked as intended: this flag no longer counts against the score.");
      }
      case "unintend": {
        teacherOnly();
        unmarkIntended(take.id, input.markId);
        return done("The flag counts again.");
      }
      case "review":
      case "unreview": {
        teacherOnly();
        return done(applyReviewIntent(input.intent, take.id, user.id));
      }
    }
  } catch (e) {
    if (e instanceof FeedbackRefused) return formFailure({ form, formError: e.message });
    throw e;
  }
}
