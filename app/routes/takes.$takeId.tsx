import { useMemo } from "react";
import { data, Link, useActionData } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/takes.$takeId";
import { deny, isTeacherOfTake, requireActiveInStudio, requireTakeAccess } from "~/auth/access.server";
import { buttonClass } from "~/components/Button";
import { Card } from "~/components/Card";
import { FlashMessage } from "~/components/FlashMessage";
import { PageHeader } from "~/components/PageHeader";
import { PracticeCare } from "~/components/PracticeCare";
import { TakeAnalysisView } from "~/components/take/TakeAnalysisView";
import { PracticeCheckCard } from "~/components/take/PracticeCheckCard";
import { TakeManage } from "~/components/take/TakeManage";
import { ChangeComments } from "~/components/feedback/ChangeComments";
import { ExerciseGrading } from "~/components/feedback/ExerciseGrading";
import { FeedbackPanel } from "~/components/feedback/FeedbackPanel";
import { IntendedFlags } from "~/components/feedback/IntendedFlags";
import { ReviewToggle } from "~/components/feedback/ReviewToggle";
import { takePageFeedback } from "~/models/feedback.server";
import { withIntendedMarks } from "~/takes/intendedScore";
import { heardKey, nextStep } from "~/takes/nextStep";
import { placeMismatches } from "~/takes/mismatchPlaces";
import { practiceCheck, type PracticeCheck } from "~/takes/practiceCheck";
import { stitchWindows, timelineOf, windowOf, windowVersion } from "~/takes/takeWindows";
import type { TakeAnalysis } from "~/analysis/types";
import { failureMessage, failureOf } from "~/forms/failure";
import { formFailure, parseForm, readForm, redirectWithFlash } from "~/forms/forms.server";
import { clock, keyOf, pretty } from "~/utils/noteText";
import { replaceTakeFromForm } from "~/takes/takeUpload.server";
import { formatBytes } from "~/takes/uploadRows";
import { exerciseForStudent, listExercisesForStudent } from "~/models/exercises.server";
import { deleteTake, fitNoticeForTake, getTakeView, moveTake } from "~/models/takes.server";
import { ExerciseFitNotice, MoveToLikelyForm } from "~/components/upload/ExerciseFitNotice";
import { studioTimeZone } from "~/models/progress.server";
import { studioDateTime, zoneName } from "~/utils/studioTime";

export const meta: Route.MetaFunction = ({ data }) => [
  {
    title: data
      ? `${data.view.take.exerciseTitle ?? "Practice take"} · ${studioDateTime(data.view.take.recordedAt, data.zone)} · Nearnote`
      : "Take · Nearnote",
  },
];

/** The first flagged change is where a student's attention should go first. */
function firstToLookAt(analysis: TakeAnalysis): number | null {
  if (analysis.changes.length === 0) return null;
  const flagged = analysis.changes.findIndex((c) => c.flags.length > 0 || analysis.chords[c.to]?.flags.length);
  return flagged === -1 ? 0 : flagged;
}

/**
 * The analysis as the page carries it: the summary, the time line of every harmony and one
 * window of changes (where the student should look first, or `?change=N`); the page fetches
 * the other windows from /api/takes/:id/window. What needs the whole take (the next step,
 * where the differences from the exercise sit) is worked out here.
 */
function analysisForPage(
  analysis: TakeAnalysis,
  notes: Parameters<typeof windowOf>[1],
  asked: number | null,
  heard: string | null,
  intended: Parameters<typeof nextStep>[3],
) {
  const initialSelected =
    analysis.changes.length === 0
      ? null
      : asked !== null
        ? Math.min(asked, analysis.changes.length - 1)
        : firstToLookAt(analysis);
  return {
    summary: analysis.summary,
    timeline: timelineOf(analysis, notes),
    firstWindow: windowOf(analysis, notes, initialSelected ?? 0),
    initialSelected,
    step: nextStep(analysis, heard, keyOf(analysis.summary.key), intended),
    placed: placeMismatches(analysis),
  };
}

const changeQuery = z.coerce.number().int().min(1).max(10_000_000);
/** A progression to check a free-practice take against (`?against=I IV V I&in=D`), and its key. */
const practiceQuery = z.object({
  against: z.string().trim().max(300).catch(""),
  in: z.string().trim().max(8).catch(""),
});

export async function loader({ request, params, context }: Route.LoaderArgs) {
  const { user, take } = await requireTakeAccess({ request, context }, params.takeId);
  // "Go to change N" works without scripts: the page opens at that change's window.
  const askedParam = changeQuery.safeParse(new URL(request.url).searchParams.get("change") ?? undefined);
  const asked = askedParam.success ? askedParam.data - 1 : null;
  const view = await getTakeView(take.id);
  if (!view) throw data("There is no such take.", { status: 404 });
  const isOwner = user.id === take.studentId;
  // Comments, intended flags and review state; opening the page reads the comments.
  const feedback = takePageFeedback(user, take, isTeacherOfTake(user, take));
  // The score shown leaves out the flags the teacher marked as intended.
  if (view.analysis) view.analysis = withIntendedMarks(view.analysis, feedback.intended);
  const exercises = isOwner
    ? listExercisesForStudent(user.id, take.studioId).map((e) => ({ id: e.id, title: e.title, keys: e.keys }))
    : [];
  // The key the notes suggest, for a take checked against an exercise ("this sounds like D major").
  const heard = view.analysis?.summary.target !== undefined ? heardKey(view.notes, view.analysis.chords) : null;
  const { notes, pedal: _pedal, analysis, ...rest } = view;
  const windowed = analysis
    ? { ...analysisForPage(analysis, notes, asked, heard, feedback.intended), version: windowVersion(take) }
    : null;
  // A take without an exercise: the key it is heard in, the open exercise it likely is, and a
  // progression the page is asked to check it against (nothing stored, the score unchanged).
  let practice: (PracticeCheck & { key: string }) | null = null;
  if (!take.exerciseId && analysis) {
    const query = new URL(request.url).searchParams;
    const asked = practiceQuery.parse({ against: query.get("against") ?? "", in: query.get("in") ?? "" });
    const open = listExercisesForStudent(take.studentId, take.studioId);
    const check = practiceCheck(
      notes,
      analysis.chords,
      open,
      asked.against ? { target: asked.against, key: asked.in || take.key || analysis.summary.key } : null,
    );
    practice = { ...check, key: asked.in || take.key || check.heardKey || analysis.summary.key };
  }
  // Times as the studio's clock shows them, for teacher and student alike.
  const zone = studioTimeZone(take.studioId);
  return { view: rest, windowed, isOwner, exercises, feedback, fit: fitNoticeForTake(take.id), zone, practice };
}

const CHOOSE = "Choose an exercise and a key.";
const actionSchema = z.discriminatedUnion("intent", [
  z.object({
    intent: z.literal("delete"),
    confirm: z.literal("yes", { error: "Tick the box to confirm: a deleted take cannot be brought back." }),
  }),
  z.object({
    intent: z.literal("move"),
    exerciseId: z
      .string({ error: CHOOSE })
      .trim()
      .max(64, CHOOSE)
      .transform((v) => v || null),
    key: z
      .string({ error: CHOOSE })
      .trim()
      .max(8, CHOOSE)
      .transform((v) => v || null),
  }),
]);

export async function action({ request, params, context }: Route.ActionArgs) {
  const { user, take } = await requireTakeAccess({ request, context }, params.takeId);
  if (user.id !== take.studentId) deny("page", "Only the student who played this take can change it.");

  // A replacement arrives as multipart; the parser must read the body first, so its intent is in the URL.
  if (new URL(request.url).searchParams.get("intent") === "replace") {
    requireActiveInStudio(user, take.studioId);
    const result = await replaceTakeFromForm(request, user, take);
    if ((result.status === 201 || result.status === 422) && result.body.id) {
      const message =
        result.status === 201
          ? "Take replaced and analysed."
          : "Take replaced, but the new file could not be analysed.";
      return redirectWithFlash(`/takes/${result.body.id}`, message, request);
    }
    const replaceForm = new FormData();
    replaceForm.set("intent", "replace");
    return formFailure({
      form: replaceForm,
      formError: result.body.error ?? "The new file could not be saved.",
      status: result.status,
    });
  }

  const form = await readForm(request);
  const parsed = parseForm(actionSchema, form);
  if (!parsed.ok) return parsed.response;
  const input = parsed.data;
  if (input.intent === "delete") {
    await deleteTake(take.id);
    return redirectWithFlash("/home", "Take deleted, with its file.", request);
  }
  requireActiveInStudio(user, take.studioId);
  const { exerciseId } = input;
  let { key } = input;
  if (exerciseId) {
    const exercise = exerciseForStudent(user.id, take.studioId, exerciseId);
    if (!exercise) return formFailure({ form, formError: "That exercise is not one of yours." });
    key ??= exercise.keys[0] ?? null;
    if (key && !exercise.keys.includes(key)) {
      return formFailure({
        form,
        formError: `This exercise is set in ${exercise.keys.map(pretty).join(", ")}, not ${pretty(key)}.`,
      });
    }
  }
  await moveTake(take.id, exerciseId, key);
  return redirectWithFlash(
    `/takes/${take.id}`,
    exerciseId ? "Take moved and graded against the exercise again." : "Take moved to free practice.",
    request,
  );
}

export default function TakePage({ loaderData }: Route.ComponentProps) {
  const { view, windowed, isOwner, exercises, feedback, fit, zone, practice } = loaderData;
  // The flags list and the exercise's grading read chords and changes from the time line and the first window.
  const analysis = useMemo(
    () =>
      windowed
        ? {
            ...stitchWindows(windowed.timeline, new Map([[windowed.firstWindow.from, windowed.firstWindow]])),
            summary: windowed.summary,
          }
        : null,
    [windowed],
  );
  // Changes a comment is pinned to carry a mark in the change list and under the roll.
  const commented = useMemo(
    () => new Set(feedback.threads.flatMap((t) => (t.changeIdx === null ? [] : [t.changeIdx]))),
    [feedback.threads],
  );
  const { take } = view;
  const actionData = useActionData<typeof action>();
  const failure = failureOf(actionData);
  const failed = failureMessage(failure);
  const error = failure && failed ? { intent: failure.intent ?? "", message: failed } : null;
  const lead = [
    isOwner ? null : take.studentName,
    `recorded ${studioDateTime(take.recordedAt, zone)}`,
    take.durationSec ? clock(take.durationSec) : null,
    take.key ? `in ${pretty(take.key)}` : null,
  ]
    .filter(Boolean)
    .join(" · ");
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title={take.exerciseTitle ?? "Free practice take"}
        lead={lead}
        actions={
          <>
            <a href={`/api/takes/${take.id}/file`} className={buttonClass("secondary")} download>
              Download MIDI
            </a>
            {feedback.asTeacher ? <ReviewToggle takeId={take.id} review={feedback.review} /> : null}
            {isOwner ? (
              <Link to="/takes/new" className={buttonClass("primary")}>
                Upload another
              </Link>
            ) : null}
          </>
        }
      />
      {take.note ? (
        <blockquote className="rounded-md border-l-4 border-tide bg-card px-4 py-2 text-sm">
          <span className="font-semibold">{isOwner ? "Your note" : `${take.studentName.split(" ")[0]}'s note`}:</span>{" "}
          {take.note}
        </blockquote>
      ) : null}

      {fit ? <ExerciseFitNotice takeId={take.id} notice={fit} canMove={isOwner} /> : null}
      {fit && isOwner ? <MoveToLikelyForm takeId={take.id} notice={fit} /> : null}

      {take.status === "analysed" && windowed ? (
        // Keyed by the recording: after a replace (same take, new file) selection and playback start afresh.
        <TakeAnalysisView
          key={`${take.id}:${take.recordedAt}:${take.size}`}
          takeId={take.id}
          version={windowed.version}
          summary={windowed.summary}
          timeline={windowed.timeline}
          firstWindow={windowed.firstWindow}
          step={windowed.step}
          placed={windowed.placed}
          initialSelected={windowed.initialSelected}
          durationSec={take.durationSec}
          commented={commented}
          changeExtras={(i) => (
            <ChangeComments
              takeId={take.id}
              changeIdx={i}
              threads={feedback.threads}
              canStart={feedback.asTeacher}
              canReply={feedback.canReply}
            />
          )}
        />
      ) : (
        <Card title={take.status === "failed" ? "This take could not be analysed" : "Waiting for analysis"}>
          <FlashMessage tone={take.status === "failed" ? "error" : "info"}>
            {take.error ?? "The analysis has not run yet. It runs again when Nearnote restarts; reload in a minute."}
          </FlashMessage>
          <dl className="mt-4 grid grid-cols-[max-content_1fr] gap-x-6 gap-y-1 text-sm">
            <dt className="text-ink-soft">File</dt>
            <dd>{take.originalName}</dd>
            <dt className="text-ink-soft">Size</dt>
            <dd>{formatBytes(take.size)}</dd>
            <dt className="text-ink-soft">Uploaded</dt>
            <dd>
              {studioDateTime(take.createdAt, zone)} ({zoneName(zone)} time)
            </dd>
          </dl>
          <p className="mt-3 text-sm text-ink-soft">
            The file is kept, so nothing is lost: it is analysed again when the engine improves. You can also replace it
            with a new recording below.
          </p>
        </Card>
      )}

      {take.status === "analysed" && analysis && analysis.summary.accuracy !== undefined ? (
        <Card title={`Against the exercise${take.exerciseTitle ? `: ${take.exerciseTitle}` : ""}`}>
          <ExerciseGrading analysis={analysis} focusTechniques={feedback.focusTechniques} />
        </Card>
      ) : null}
      {take.status === "analysed" && analysis && practice ? (
        <PracticeCheckCard
          takeId={take.id}
          check={practice}
          analysis={analysis}
          isOwner={isOwner}
          studentFirstName={take.studentName.split(" ")[0]}
        />
      ) : null}
      {take.status === "analysed" && analysis ? (
        <Card title="Flags">
          <IntendedFlags
            takeId={take.id}
            analysis={analysis}
            marks={feedback.intended}
            asTeacher={feedback.asTeacher}
            score={feedback.score}
            engineScore={feedback.engineScore}
          />
        </Card>
      ) : null}
      <Card title="Feedback">
        <FeedbackPanel
          takeId={take.id}
          threads={feedback.threads}
          canStart={feedback.asTeacher}
          canReply={feedback.canReply}
        />
      </Card>

      {isOwner ? (
        <Card title="Manage this take">
          <TakeManage exercises={exercises} exerciseId={take.exerciseId} takeKey={take.key} error={error} />
        </Card>
      ) : null}
      <PracticeCare />
    </div>
  );
}
