import { readFileSync } from "node:fs";
import http from "node:http";
import { beforeEach, describe, expect, it } from "vitest";
import { db } from "~/db/client.server";
import { takes } from "~/db/schema";
import { useHttpApp } from "../support/httpApp";
import { storedTakeFiles, useFreshApp } from "../support/setup";
import { join, makeStudio, makeUser, PASSWORD } from "./accountsKit";

// These run against the real HTTP server (the built app behind Express), so a
// refused upload is refused on the wire and the server is seen to stay up.
const app = useFreshApp();
const http_ = useHttpApp();
let base = "";
let cookie = "";

beforeEach(async () => {
  base = http_.base;
  const studio = makeStudio("Harbour Lane");
  const student = makeUser("dara@harbour.example");
  join(studio.id, student.id, "student");
  cookie = await http_.signIn(student.email, PASSWORD);
});

const sample = () => new Uint8Array(readFileSync("samples/held-bass-d.mid"));
const storedFiles = () => storedTakeFiles(app.storageDir).length;

function post(form: FormData | null, headers: Record<string, string> = {}) {
  return fetch(`${base}/api/takes`, {
    method: "POST",
    body: form,
    headers: { Cookie: cookie, Origin: base, ...headers },
  });
}

function form(...files: { name: string; bytes: Uint8Array }[]) {
  const f = new FormData();
  for (const file of files) f.append("file", new File([new Uint8Array(file.bytes)], file.name));
  return f;
}

/** A raw request with a declared length far beyond what is sent. */
function hugeDeclaredLength(): Promise<number> {
  return new Promise((resolve, reject) => {
    const req = http.request(`${base}/api/takes`, {
      method: "POST",
      headers: {
        Cookie: cookie,
        Origin: base,
        "Content-Type": "multipart/form-data; boundary=x",
        "Content-Length": String(50 * 1024 ** 3),
      },
    });
    req.on("response", (res) => {
      res.resume();
      resolve(res.statusCode ?? 0);
      req.destroy();
    });
    req.on("error", reject);
    req.write("--x\r\n");
  });
}

describe("abusive uploads against the running server", () => {
  it("gives each its clear error, keeps nothing it refused, and keeps serving", async () => {
    const tooBig = new Uint8Array(2 * 1024 * 1024 + 1);
    tooBig.set(sample());
    const r1 = await post(form({ name: "big.mid", bytes: tooBig }));
    expect(r1.status).toBe(413);
    expect((await r1.json()).error).toMatch(/over 2 MiB/);

    const r2 = await post(form(...Array.from({ length: 11 }, (_, i) => ({ name: `t${i}.mid`, bytes: sample() }))));
    expect(r2.status).toBe(413);
    expect((await r2.json()).error).toMatch(/at most 10 files/);

    expect(await hugeDeclaredLength()).toBe(413);

    const r4 = await post(null, { "Content-Type": "multipart/form-data; boundary=nothing" });
    expect(r4.status).toBe(400);
    expect((await r4.json()).error).toMatch(/could not be read|Choose a MIDI file/);

    // A part header that is not UTF-8 (RFC 3629): the client's error (400), not the server's.
    const badHeader = Buffer.concat([
      Buffer.from('--x\r\nContent-Disposition: form-data; name="file"; filename="'),
      Buffer.from([0xff, 0xfe, 0xc3, 0x28]),
      Buffer.from('.mid"\r\nContent-Type: audio/midi\r\n\r\nMThd\r\n--x--\r\n'),
    ]);
    const r4b = await fetch(`${base}/api/takes`, {
      method: "POST",
      body: badHeader,
      headers: { Cookie: cookie, Origin: base, "Content-Type": "multipart/form-data; boundary=x" },
    });
    expect(r4b.status).toBe(400);

    // A header chunk declaring absurd sizes: a MIDI file, but a broken one — kept as failed.
    const absurd = sample();
    new DataView(absurd.buffer).setUint32(4, 0xffffffff);
    new DataView(absurd.buffer).setUint16(10, 0xffff);
    const r5 = await post(form({ name: "absurd.mid", bytes: absurd }));
    expect(r5.status).toBe(422);
    expect((await r5.json()).error).toMatch(/cut short or damaged/);

    expect(storedFiles()).toBe(1); // only the failed take is kept, by design

    // A hostile file name never reaches a path, and the server still works.
    const r6 = await post(form({ name: "../../etc/pass\u0007wd\r\n.mid", bytes: sample() }));
    expect(r6.status).toBe(201);
    const { id } = await r6.json();
    const saved = db()
      .select()
      .from(takes)
      .all()
      .find((t) => t.id === id)!;
    // The browser's multipart encoding percent-escapes CR and LF; we drop the path and control characters.
    expect(saved.originalName).toMatch(/^passwd/);
    expect(saved.originalName).not.toMatch(/[/\\\u0000-\u001f]/);
    expect(saved.fileKey).toMatch(/^[0-9a-f-]{36}$/);
    expect(storedFiles()).toBe(2);
    const health = await fetch(`${base}/healthz`);
    expect(health.status).toBe(200);
  }, 60_000);
});

describe("cleanName", () => {
  it("keeps a display name only: no folders, no control characters", async () => {
    const { cleanName } = await import("~/takes/takeUpload.server");
    expect(cleanName("../../etc/pass\u0007wd.mid")).toBe("passwd.mid");
    expect(cleanName("C:\\Users\\dara\\take 1.mid")).toBe("take 1.mid");
    expect(cleanName("\u0000\u001f")).toBe("take.mid");
  });
});
