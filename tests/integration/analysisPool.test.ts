import { availableParallelism } from "node:os";
import { readFileSync } from "node:fs";
import path from "node:path";
import { eq } from "drizzle-orm";
import { afterEach, describe, expect, it } from "vitest";
import { AnalysisError } from "~/analysis";
import { db } from "~/db/client.server";
import { takes } from "~/db/schema";
import { resetEnvForTests } from "~/server/env.server";
import { analyseInWorker, analysisThreads } from "~/takes/analysisPool.server";
import { analyseTake } from "~/takes/analysisWorker/task";
import { moveTake, reanalyseTake } from "~/models/takes.server";
import { denseChordTake } from "../../scripts/lib/denseTake";
import { storedTakeFiles, useFreshApp } from "../support/setup";
import { ask } from "../support/app";
import { join, makeExercise, makeStudio, makeUser, ORIGIN, signIn } from "./accountsKit";

// The server analyses takes on worker threads with a time limit per take. The
// worst case is the densest file the engine accepts: random eight-key chords up
// to its note limit (see scripts/lib/denseTake.ts).
const app = useFreshApp();
const sample = (name: string) => new Uint8Array(readFileSync(path.resolve("samples", name)));
const TOO_COMPLEX = new AnalysisError("too-complex").message;
let worstCase: Uint8Array | undefined;
const worst = () => (worstCase ??= denseChordTake(12_400));

afterEach(() => {
  delete process.env.ANALYSIS_TIME_LIMIT_MS;
  resetEnvForTests();
});

function limitTo(ms: number) {
  process.env.ANALYSIS_TIME_LIMIT_MS = String(ms);
  resetEnvForTests();
}

describe("the analysis pool", () => {
  it("keeps one core for the server: at most cores - 1 workers, at least one", () => {
    expect(analysisThreads()).toBe(Math.max(1, availableParallelism() - 1));
  });

  it("gives the same analysis as the engine on this thread", async () => {
    const bytes = sample("three-chord-smoothing-d.mid");
    const inWorker = await analyseInWorker(bytes, { key: "D", target: "I IV V I" });
    expect(inWorker).toEqual(analyseTake(bytes, { key: "D", target: "I IV V I" }));
    expect(inWorker.ok).toBe(true);
  });

  it("stops a take past the time limit as too complex, and the next take is analysed by a fresh worker", async () => {
    const outcome = await analyseInWorker(worst(), {}, 300);
    expect(outcome).toEqual({ ok: false, error: TOO_COMPLEX, code: "too-complex" });
    const next = await analyseInWorker(sample("held-bass-d.mid"), {}, 10_000);
    expect(next.ok).toBe(true);
  }, 60_000);

  it("keeps an upload past the time limit as a failed take (422) with the reason", async () => {
    const studio = makeStudio("Harbour Lane");
    const dara = makeUser("dara@harbour.example", "Dara");
    join(studio.id, dara.id, "student");
    const jar = await signIn(dara.email);
    limitTo(300);
    const form = new FormData();
    form.append("file", new File([new Uint8Array(worst())], "dense.mid", { type: "audio/midi" }));
    const r = await ask(
      new Request(`${ORIGIN}/api/takes`, {
        method: "POST",
        body: form,
        headers: { Cookie: jar.header(), Origin: ORIGIN },
      }),
    );
    expect(r.status).toBe(422);
    expect(r.data).toMatchObject({ status: "failed", error: TOO_COMPLEX });
    const take = db().select().from(takes).get()!;
    expect(take.status).toBe("failed");
    expect(take.error).toBe(TOO_COMPLEX);
    expect(storedTakeFiles(app.storageDir)).toHaveLength(1); // kept, so a later engine can grade it
  }, 60_000);

  it("guards re-analysis and moving a take with the same limit", async () => {
    const studio = makeStudio("Harbour Lane");
    const dara = makeUser("dara@harbour.example", "Dara");
    join(studio.id, dara.id, "student");
    const exercise = makeExercise(studio.id);
    const jar = await signIn(dara.email);
    const form = new FormData();
    form.append("file", new File([sample("held-bass-d.mid")], "held.mid", { type: "audio/midi" }));
    const up = await ask<{ id: string }>(
      new Request(`${ORIGIN}/api/takes`, {
        method: "POST",
        body: form,
        headers: { Cookie: jar.header(), Origin: ORIGIN },
      }),
    );
    expect(up.status).toBe(201);
    const id = up.data.id;
    // The stored file swapped for the worst case, as if an older engine had let it through.
    const take = db().select().from(takes).where(eq(takes.id, id)).get()!;
    const { takeStorage } = await import("~/takes/takeFiles.server");
    await takeStorage().put(take.fileKey, new File([new Uint8Array(worst())], "held.mid"));
    limitTo(300);
    expect(await reanalyseTake(id)).toBe("failed");
    expect(db().select().from(takes).where(eq(takes.id, id)).get()!.error).toBe(TOO_COMPLEX);
    await moveTake(id, exercise.id, "D");
    expect(db().select().from(takes).where(eq(takes.id, id)).get()).toMatchObject({
      exerciseId: exercise.id,
      status: "failed",
      error: TOO_COMPLEX,
    });
  }, 60_000);
});
