// Feedback on a take: pinned comments, replies, read state, intended flags and the score they
// change, review and undo. The take is played so its flags are known by hand (RULES.md rule 9).
import { eq } from "drizzle-orm";
import { beforeEach, describe, expect, it } from "vitest";
import { db } from "~/db/client.server";
import { takeMetrics, takeReviews } from "~/db/schema";
import {
  commentThreads,
  reviewQueue,
  reviewQueueCount,
  takePageFeedback,
  unreadFeedback,
} from "~/models/feedback.server";
import { reanalyseTake } from "~/models/takes.server";
import { useFreshApp } from "../support/setup";
import { ask } from "../support/app";
import { CookieJar, get, join, makeExercise, makeStudio, makeUser, signIn, useMailCatcher } from "./accountsKit";
import { chordsMidi, formPost, uploadAnalysed } from "./exercisesKit";

const app = useFreshApp();
const mail = useMailCatcher(app);

let ines: CookieJar, dara: CookieJar, felix: CookieJar;
let ids: { ines: string; dara: string; felix: string; studio: string; take: string };
let engine: {
  score: number;
  scoreParts: {
    smoothness: number;
    cleanliness: number;
    techniqueVariety: number;
    steadiness: number;
    accuracy: number | null;
  };
};

// Root position everywhere in D: D -> G moves every voice up 5 and A -> D every voice down 7,
// both root-position leaps (rule 9); G -> A moves each voice 2, under the 3-semitone limit.
const CLUMSY = [
  [62, 66, 69],
  [67, 71, 74],
  [69, 73, 76],
  [62, 66, 69],
];

beforeEach(async () => {
  const studio = makeStudio("Tidewater Keys");
  const p = {
    ines: makeUser("ines@tidewater.example", "Ines Marlowe"),
    dara: makeUser("dara@tidewater.example", "Dara Okafor"),
    felix: makeUser("felix@tidewater.example", "Felix Brandt"),
  };
  join(studio.id, p.ines.id, "owner");
  join(studio.id, p.dara.id, "student");
  join(studio.id, p.felix.id, "student");
  const exercise = makeExercise(studio.id);
  [ines, dara, felix] = [await signIn(p.ines.email), await signIn(p.dara.email), await signIn(p.felix.email)];
  const body = await uploadAnalysed(dara, chordsMidi(CLUMSY), { exerciseId: exercise.id, key: "D" });
  engine = body.analysis.summary as unknown as typeof engine;
  ids = { ines: p.ines.id, dara: p.dara.id, felix: p.felix.id, studio: studio.id, take: body.id };
});

const postFeedback = (jar: CookieJar, fields: Record<string, string>) =>
  ask(formPost(`/takes/${ids.take}/feedback`, fields, jar));
const metrics = () => db().select().from(takeMetrics).where(eq(takeMetrics.takeId, ids.take)).get()!;

describe("comments and replies", () => {
  it("a comment pinned to a change reaches the student by mail and as unread feedback; the reply joins the thread", async () => {
    const r = await postFeedback(ines, { intent: "comment", changeIdx: "0", body: "Try keeping D on top here." });
    expect(r.status).toBe(302);
    expect(r.location).toBe(`/takes/${ids.take}#change-0`);

    const notice = mail.latestTo("dara@tidewater.example");
    expect(notice.subject).toContain("Ines Marlowe commented");
    expect(notice.text).toContain("> Try keeping D on top here.");
    expect(notice.text).toContain(`/takes/${ids.take}#change-0`);
    expect(notice.text).toMatch(/\/unsubscribe\?token=/);

    expect(unreadFeedback(ids.dara, ids.studio)).toEqual([
      expect.objectContaining({
        takeId: ids.take,
        count: 1,
        latest: expect.objectContaining({ changeIdx: 0, authorName: "Ines Marlowe" }),
      }),
    ]);
    const [thread] = commentThreads(ids.take, ids.dara);
    expect(thread).toMatchObject({ changeIdx: 0, unread: true, body: "Try keeping D on top here." });

    // The student reads the take: nothing unread any more.
    takePageFeedback({ id: ids.dara }, { id: ids.take, studentId: ids.dara, exerciseId: null }, false);
    expect(unreadFeedback(ids.dara, ids.studio)).toEqual([]);

    const reply = await postFeedback(dara, {
      intent: "comment",
      parentId: thread.id,
      body: "Like this? I kept the hand still.",
    });
    expect(reply.status).toBe(302);
    const [after] = commentThreads(ids.take, ids.ines);
    expect(after.replies).toEqual([
      expect.objectContaining({
        body: "Like this? I kept the hand still.",
        changeIdx: 0,
        unread: true,
        authorName: "Dara Okafor",
      }),
    ]);
    // The student's own reply is not feedback for her, and sends her no mail.
    expect(unreadFeedback(ids.dara, ids.studio)).toEqual([]);
    expect(mail.all().filter((m) => m.to.includes("dara@tidewater.example"))).toHaveLength(1);
  });

  it("the take page carries the threads, marks them read for whoever opens it, and offers review to teachers only", async () => {
    await postFeedback(ines, { intent: "comment", changeIdx: "0", body: "Keep the top note." });
    const asStudent = (
      await ask<{
        feedback: {
          threads: Array<{ changeIdx: number | null; unread: boolean }>;
          asTeacher: boolean;
          canReply: boolean;
          review: unknown;
        };
      }>(get(`/takes/${ids.take}`, dara))
    ).data;
    expect(asStudent.feedback).toMatchObject({ asTeacher: false, canReply: true, review: null });
    expect(asStudent.feedback.threads).toEqual([expect.objectContaining({ changeIdx: 0, unread: true })]);
    expect(unreadFeedback(ids.dara, ids.studio)).toEqual([]);
    const asTeacher = (
      await ask<{
        feedback: { asTeacher: boolean };
      }>(get(`/takes/${ids.take}`, ines))
    ).data;
    expect(asTeacher.feedback.asTeacher).toBe(true);
    expect(reviewQueueCount(ids.studio)).toBe(1);
  });

  it("counts unread comments per take and leaves out the student's own", async () => {
    await postFeedback(ines, { intent: "comment", body: "Good steady tempo." });
    await postFeedback(ines, { intent: "comment", changeIdx: "2", body: "Big jump here." });
    expect(unreadFeedback(ids.dara, ids.studio)[0].count).toBe(2);
  });

  it("students only reply, and only on their own takes; a change must exist", async () => {
    expect((await postFeedback(dara, { intent: "comment", body: "A note to myself" })).status).toBe(403);
    expect((await postFeedback(felix, { intent: "comment", body: "Nice" })).status).toBe(403);
    const bad = await postFeedback(ines, { intent: "comment", changeIdx: "9", body: "Where?" });
    expect(bad.status).toBe(400);
    expect((await postFeedback(ines, { intent: "comment", body: "   " })).status).toBe(400);
  });

  it("shows the unread feedback on the student's home page, and the review count on the teacher's", async () => {
    await postFeedback(ines, { intent: "comment", changeIdx: "2", body: "Big jump here." });
    const student = (
      await ask<{
        student: { unread: Array<{ takeId: string; count: number }> };
      }>(get("/home", dara))
    ).data;
    expect(student.student.unread).toEqual([expect.objectContaining({ takeId: ids.take, count: 1 })]);
    const teacher = (await ask<{ teacher: { toReview: number } }>(get("/home", ines))).data;
    expect(teacher.teacher.toReview).toBe(1);
  });

  it("sends no mail to a student who turned feedback mail off", async () => {
    const { users } = await import("~/db/schema");
    db().update(users).set({ mailOnFeedback: false }).where(eq(users.id, ids.dara)).run();
    await postFeedback(ines, { intent: "comment", body: "Well done." });
    expect(mail.all()).toHaveLength(0);
  });
});

describe("intended flags", () => {
  // SCORE.md, with a target: 100 × (0.35 smoothness + 0.25 clean + 0.10 variety + 0.10 steady + 0.20 accuracy).
  const byHand = (clean: number) => {
    const p = engine.scoreParts;
    return Math.round(
      100 *
        (0.35 * p.smoothness + 0.25 * clean + 0.1 * p.techniqueVariety + 0.1 * p.steadiness + 0.2 * (p.accuracy ?? 0)),
    );
  };

  it("leaves a flag the teacher asked for out of the score, with the reason shown, and keeps it out after re-analysis", async () => {
    // 4 chords + 3 graded changes = 7 items, 2 of them flagged: clean playing 5/7.
    expect(engine.scoreParts.cleanliness).toBeCloseTo(5 / 7, 10);
    expect(engine.score).toBe(byHand(5 / 7));
    expect(metrics().flags["root-position-leap"]).toBe(2);

    const r = await postFeedback(ines, {
      intent: "intend",
      on: "change",
      idx: "0",
      flag: "root-position-leap",
      reason: "I asked for a block jump to hear it.",
    });
    expect(r.status).toBe(302);
    expect(metrics().score).toBe(byHand(6 / 7));
    expect(metrics().score).toBeGreaterThan(engine.score);
    expect(metrics().flags["root-position-leap"]).toBe(1);
    expect(metrics().rootPositionLeaps).toBe(1);
    expect(metrics().analysis.summary.score).toBe(engine.score); // the engine's own result is kept

    const page = takePageFeedback({ id: ids.dara }, { id: ids.take, studentId: ids.dara, exerciseId: null }, false);
    expect(page.intended).toEqual([
      expect.objectContaining({
        on: "change",
        idx: 0,
        reason: "I asked for a block jump to hear it.",
        byName: "Ines Marlowe",
      }),
    ]);
    expect(page.score).toBe(byHand(6 / 7));

    // The take page shows the score without the intended flag, and the engine's beside it.
    const shown = (
      await ask<{
        windowed: { summary: { score: number; scoreParts: { cleanliness: number } } };
        feedback: { score: number; engineScore: number };
      }>(get(`/takes/${ids.take}`, dara))
    ).data;
    expect(shown.windowed.summary.score).toBe(byHand(6 / 7));
    expect(shown.windowed.summary.scoreParts.cleanliness).toBeCloseTo(6 / 7, 10);
    expect(shown.feedback).toMatchObject({ score: byHand(6 / 7), engineScore: engine.score });

    expect(await reanalyseTake(ids.take)).toBe("analysed");
    expect(metrics().score).toBe(byHand(6 / 7));

    await postFeedback(ines, { intent: "unintend", markId: page.intended[0].id });
    expect(metrics().score).toBe(engine.score);
    expect(metrics().flags["root-position-leap"]).toBe(2);
  });

  it("refuses a flag the take does not carry there, and refuses students", async () => {
    expect(
      (await postFeedback(ines, { intent: "intend", on: "change", idx: "1", flag: "root-position-leap", reason: "x" }))
        .status,
    ).toBe(400);
    expect(
      (await postFeedback(ines, { intent: "intend", on: "change", idx: "0", flag: "root-position-leap", reason: "" }))
        .status,
    ).toBe(400);
    expect(
      (
        await postFeedback(dara, {
          intent: "intend",
          on: "change",
          idx: "0",
          flag: "root-position-leap",
          reason: "mine",
        })
      ).status,
    ).toBe(403);
  });
});

describe("review queue", () => {
  it("lists unreviewed takes newest first; marking reviewed is explicit and can be undone", async () => {
    const second = await uploadAnalysed(
      dara,
      chordsMidi([
        [62, 66, 69],
        [62, 67, 71],
      ]),
      { key: "D" },
    );
    const queue = reviewQueue(ids.studio);
    expect(queue.map((t) => t.id)).toEqual([second.id, ids.take]);
    expect(queue[1]).toMatchObject({
      studentName: "Dara Okafor",
      exerciseTitle: "Three-chord smoothing in D",
      key: "D",
      flags: expect.objectContaining({ "root-position-leap": 2 }),
    });

    // Opening the take page does not review it.
    takePageFeedback({ id: ids.ines }, { id: ids.take, studentId: ids.dara, exerciseId: null }, true);
    expect(reviewQueueCount(ids.studio)).toBe(2);

    const done = await ask(formPost("/review", { intent: "review", takeId: ids.take }, ines));
    expect(done.status).toBe(302);
    expect(done.location).toBe(`/review?undo=${ids.take}`);
    expect(reviewQueue(ids.studio).map((t) => t.id)).toEqual([second.id]);
    const page = (await ask<{ undo: string[] }>(get(`/review?undo=${ids.take}`, ines))).data;
    expect(page.undo).toEqual([ids.take]);

    await ask(formPost("/review", { intent: "unreview", takeId: ids.take }, ines));
    expect(reviewQueueCount(ids.studio)).toBe(2);

    // The same from the take page's button.
    await postFeedback(ines, { intent: "review" });
    expect(db().select().from(takeReviews).all()).toEqual([
      expect.objectContaining({ takeId: ids.take, reviewedById: ids.ines }),
    ]);
    await postFeedback(ines, { intent: "unreview" });
    expect(db().select().from(takeReviews).all()).toEqual([]);
  });

  it("is for teachers only", async () => {
    expect((await postFeedback(dara, { intent: "review" })).status).toBe(403);
    expect((await ask(formPost("/review", { intent: "review", takeId: ids.take }, dara))).status).toBe(403);
  });
});
