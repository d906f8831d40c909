import { describe, expect, it } from "vitest";
import { send } from "../support/app";
import { useFreshApp } from "../support/setup";
import { join, makeStudio, makeTakeRow, makeUser, ORIGIN, signIn } from "./accountsKit";

// A form body that cannot be read (a multipart part header that is not UTF-8, RFC 3629;
// a body cut off before its closing boundary, RFC 7578 §4.1) is the client's error: every
// page action answers 400, never 500, and nothing is changed.
useFreshApp();

const BOUNDARY = "nearnote-boundary";

function brokenBody(kind: "not-utf8" | "cut-off") {
  if (kind === "cut-off")
    return Buffer.from(`--${BOUNDARY}\r\nContent-Disposition: form-data; name="intent"\r\n\r\nrev`);
  return Buffer.concat([
    Buffer.from(`--${BOUNDARY}\r\nContent-Disposition: form-data; name="`),
    Buffer.from([0xff, 0xfe, 0xc3, 0x28]),
    Buffer.from(`"\r\n\r\nx\r\n--${BOUNDARY}--\r\n`),
  ]);
}

function postBroken(path: string, kind: "not-utf8" | "cut-off", cookie?: string) {
  return new Request(ORIGIN + path, {
    method: "POST",
    body: brokenBody(kind),
    headers: {
      Origin: ORIGIN,
      "Content-Type": `multipart/form-data; boundary=${BOUNDARY}`,
      ...(cookie ? { Cookie: cookie } : {}),
    },
  });
}

describe("a form body that cannot be read", () => {
  it("answers 400 on the visitors' forms", async () => {
    for (const path of ["/login", "/signup", "/forgot-password", "/reset-password?token=x"]) {
      for (const kind of ["not-utf8", "cut-off"] as const) {
        const response = await send(postBroken(path, kind));
        expect([path, kind, response.status]).toEqual([path, kind, 400]);
      }
    }
  });

  it("answers 400 on signed-in forms, for teacher and student alike", async () => {
    const studio = makeStudio("Harbour Lane");
    const ines = makeUser("ines@harbour.example", "Ines");
    const dara = makeUser("dara@harbour.example", "Dara");
    join(studio.id, ines.id, "owner");
    join(studio.id, dara.id, "student");
    const take = makeTakeRow(dara.id, studio.id, "take-1");
    const teacher = (await signIn(ines.email)).header();
    const student = (await signIn(dara.email)).header();
    const cases: [string, string][] = [
      ["/settings", teacher],
      ["/students", teacher],
      ["/review", teacher],
      ["/board", teacher],
      ["/exercises/new", teacher],
      ["/studio/settings", teacher],
      [`/takes/${take.id}/feedback`, teacher],
      [`/takes/${take.id}`, student],
      ["/settings", student],
    ];
    for (const [path, cookie] of cases) {
      for (const kind of ["not-utf8", "cut-off"] as const) {
        const response = await send(postBroken(path, kind, cookie));
        expect([path, kind, response.status]).toEqual([path, kind, 400]);
      }
    }
  });
});
