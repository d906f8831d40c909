// A student's state of an exercise reads the same on home, the list of exercises and the
// exercise's page: all three come from the same loaders a browser calls.
import { describe, expect, it } from "vitest";
import { db } from "~/db/client.server";
import { exercises } from "~/db/schema";
import type { ExerciseState } from "~/utils/exerciseState";
import { todayIn } from "~/models/progressQuery.server";
import { studioTimeZone } from "~/models/progress.server";
import { useFreshApp } from "../support/setup";
import { ask } from "../support/app";
import { get, join, makeStudio, makeUser, signIn } from "./accountsKit";
import { chordsMidi, uploadAnalysed } from "./exercisesKit";

useFreshApp();

type Listed = { id: string; state: ExerciseState };

async function statesEverywhere(jar: Awaited<ReturnType<typeof signIn>>, id: string) {
  const h = (await ask<{ student: { exercises: Listed[] } }>(get("/home", jar))).data;
  const l = (
    await ask<{
      student: { due: Listed[]; done: Listed[] };
    }>(get("/exercises", jar))
  ).data;
  const p = (
    await ask<{
      state: ExerciseState;
    }>(get(`/exercises/${id}`, jar))
  ).data;
  const listed = [...l.student.due, ...l.student.done].find((e) => e.id === id)!;
  return {
    home: h.student.exercises.find((e) => e.id === id)!.state,
    list: listed.state,
    page: p.state,
    inDone: l.student.done.some((e) => e.id === id),
  };
}

describe("the student's state of an exercise", () => {
  it("is the same on home, the list and the exercise page, before and after the last key's take", async () => {
    const studio = makeStudio("Harbour Lane");
    const dara = makeUser("dara@harbour.example", "Dara");
    join(studio.id, dara.id, "student");
    const today = todayIn(studioTimeZone(studio.id));
    const yesterday = new Date(Date.parse(`${today}T00:00:00Z`) - 86_400_000).toISOString().slice(0, 10);
    const ex = db()
      .insert(exercises)
      .values({ studioId: studio.id, title: "Two keys", keys: ["D", "G"], progression: "I IV V I", dueDate: yesterday })
      .returning()
      .get();
    const jar = await signIn(dara.email);

    await uploadAnalysed(
      jar,
      chordsMidi([
        [62, 66, 69],
        [62, 67, 71],
        [61, 64, 69],
        [62, 66, 69],
      ]),
      { exerciseId: ex.id, key: "D" },
    );
    const before = await statesEverywhere(jar, ex.id);
    expect(before.home).toEqual(before.page);
    expect(before.list).toEqual(before.page);
    expect(before.page).toMatchObject({
      kind: "overdue",
      label: "1 day overdue",
      keysDone: 1,
      keysTotal: 2,
      detail: "A take in G still to send.",
    });
    expect(before.inDone).toBe(false);

    await uploadAnalysed(
      jar,
      chordsMidi([
        [67, 71, 74],
        [67, 72, 76],
        [66, 69, 74],
        [67, 71, 74],
      ]),
      { exerciseId: ex.id, key: "G" },
    );
    const after = await statesEverywhere(jar, ex.id);
    expect(after.home).toEqual(after.page);
    expect(after.list).toEqual(after.page);
    expect(after.page).toMatchObject({ kind: "done", label: "Done", keysDone: 2 });
    expect(after.inDone).toBe(true);
  });
});
