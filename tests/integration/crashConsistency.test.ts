import { spawn, type ChildProcess } from "node:child_process";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { closeDatabase, db } from "~/db/client.server";
import { takes } from "~/db/schema";
import { readTakeFile, takeFileNames } from "~/takes/takeFiles.server";
import { denseChordTake } from "../../scripts/lib/denseTake";
import { storedTakeFiles, useFreshApp } from "../support/setup";
import { join, makeStudio, makeUser, PASSWORD } from "./accountsKit";

// The server killed (SIGKILL) while uploads are in flight: every upload it
// acknowledged is there with its file after a restart, and the files of uploads
// it never acknowledged are swept when it starts again.
const app = useFreshApp();
const PORT = 3400 + Math.floor(Math.random() * 500);
const BASE = `http://127.0.0.1:${PORT}`;

function startServer(): { child: ChildProcess; output: () => string } {
  let out = "";
  // node with tsx's loader (not the tsx command, which would run the server as a grandchild
  // that a SIGKILL to its parent leaves running).
  const child = spawn(process.execPath, ["--import", "tsx", path.resolve("scripts/serve.ts")], {
    env: {
      ...process.env,
      PORT: String(PORT),
      HOST: "127.0.0.1",
      NEARNOTE_ACCESS_LOG: "off",
      NEARNOTE_BUILD_DIR: path.resolve(process.env.NEARNOTE_BUILD_DIR ?? "build"),
      NODE_ENV: "production",
      ANALYSIS_TIME_LIMIT_MS: "30000",
    },
    stdio: ["ignore", "pipe", "pipe"],
  });
  child.stdout!.on("data", (d) => (out += String(d)));
  child.stderr!.on("data", (d) => (out += String(d)));
  return { child, output: () => out };
}

async function waitUp() {
  for (let i = 0; i < 120; i++) {
    try {
      if ((await fetch(`${BASE}/healthz`)).ok) return;
    } catch {
      // not answering yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error("the server did not come up");
}

describe("a crash during uploads", () => {
  it("loses no acknowledged take, and the next start sweeps the files of the rest", async () => {
    const studio = makeStudio("Harbour Lane");
    const student = makeUser("dara@harbour.example");
    join(studio.id, student.id, "student");
    closeDatabase(); // the server owns the database from here

    let orphans: number;
    const first = startServer();
    try {
      await waitUp();
      const login = await fetch(`${BASE}/login`, {
        method: "POST",
        body: new URLSearchParams({ email: student.email, password: PASSWORD }),
        headers: { Origin: BASE },
        redirect: "manual",
      });
      expect(login.status).toBe(302);
      const cookie = login.headers
        .getSetCookie()
        .map((c) => c.split(";")[0])
        .join("; ");

      const acknowledged: string[] = [];
      const uploads = Array.from({ length: 16 }, (_, i) => {
        const form = new FormData();
        // The fourth is the densest take the engine accepts: the takes after it wait for the worker.
        const bytes = i === 3 ? denseChordTake(12_400) : denseChordTake(6, 100 + i);
        form.append("file", new File([new Uint8Array(bytes)], `take-${i}.mid`, { type: "audio/midi" }));
        return fetch(`${BASE}/api/takes`, { method: "POST", body: form, headers: { Cookie: cookie, Origin: BASE } })
          .then(async (r) => {
            if (r.status === 201 || r.status === 422) acknowledged.push(((await r.json()) as { id: string }).id);
          })
          .catch(() => {}); // cut off by the crash
      });
      // Kill the server once some uploads are acknowledged and others are still on their way.
      await expect.poll(() => acknowledged.length, { timeout: 30_000, interval: 20 }).toBeGreaterThanOrEqual(2);
      first.child.kill("SIGKILL");
      await Promise.all(uploads);
      expect(acknowledged.length).toBeLessThan(16);

      const rows = () => db().select().from(takes).all();
      for (const id of acknowledged) {
        const row = rows().find((t) => t.id === id);
        expect(row, `acknowledged take ${id}`).toBeDefined();
        expect(await readTakeFile(row!.fileKey)).not.toBeNull();
      }
      // Uploads that were waiting for the worker had stored their files, not yet their rows.
      orphans = storedTakeFiles(app.storageDir).length - rows().length;
      expect(orphans).toBeGreaterThan(0);
      closeDatabase();
    } finally {
      first.child.kill("SIGKILL");
    }

    // Files written before the crash are older than the next process.
    await new Promise((r) => setTimeout(r, 50));
    const second = startServer();
    try {
      await waitUp();
      await expect
        .poll(second.output, { timeout: 15_000 })
        .toContain(`orphan take files removed at start-up: ${orphans}`);
      const referenced = new Set(
        db()
          .select()
          .from(takes)
          .all()
          .map((t) => takeFileNames(t.fileKey).hash),
      );
      const files = storedTakeFiles(app.storageDir);
      expect(files.every((f) => referenced.has(path.basename(f, ".dat")))).toBe(true);
      expect(files).toHaveLength(referenced.size);
    } finally {
      second.child.kill("SIGTERM");
      closeDatabase();
    }
  }, 120_000);
});
