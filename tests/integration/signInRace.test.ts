// Parallel guesses at one account through the real server (Express + the built app on a
// loopback port): the throttle must hold even when every guess arrives before the first
// slow password comparison has finished.
import path from "node:path";
import { pathToFileURL } from "node:url";
import { createRequestHandler, type ServerBuild } from "react-router";
import { describe, expect, it } from "vitest";
import { MAX_FAILURES } from "~/auth/throttle.server";
import { db } from "~/db/client.server";
import { sessions } from "~/db/schema";
import { useHttpApp } from "../support/httpApp";
import { useFreshApp } from "../support/setup";
import { makeUser, PASSWORD } from "./accountsKit";

useFreshApp();
const http = useHttpApp();

const GUESSES = 40;

/** 39 wrong guesses and the right password last. */
const guesses = () => Array.from({ length: GUESSES }, (_, i) => (i === GUESSES - 1 ? PASSWORD : `wrong-guess-${i}`));

function expectThrottled(statuses: number[], label: string) {
  const tally = (status: number) => statuses.filter((s) => s === status).length;
  const signIns = tally(302);
  console.log(
    `[sign-in race, ${label}] ${GUESSES} parallel guesses: ${tally(401)} refused (401), ${tally(429)} throttled (429), ${signIns} signed in`,
  );
  // Only MAX_FAILURES attempts may reach the password comparison; every other one is a 429.
  expect(tally(401) + signIns).toBe(MAX_FAILURES);
  expect(tally(429)).toBe(GUESSES - MAX_FAILURES);
  expect(db().select().from(sessions).all()).toHaveLength(signIns);
}

describe("sign-in throttle under parallel guesses", () => {
  it(`through the server on a loopback port: only ${MAX_FAILURES} of ${GUESSES} guesses reach the password check`, async () => {
    const user = makeUser("dara@tidewater.example");
    const statuses = await Promise.all(
      guesses().map(async (password) => {
        const res = await fetch(`${http.base}/login`, {
          method: "POST",
          body: new URLSearchParams({ email: user.email, password }),
          headers: { Origin: http.base },
          redirect: "manual",
        });
        await res.arrayBuffer();
        return res.status;
      }),
    );
    expectThrottled(statuses, "HTTP");
  });

  it(`through the built request handler, all ${GUESSES} started before any finishes: still only ${MAX_FAILURES}`, async () => {
    const user = makeUser("dara@tidewater.example");
    const buildDir = path.resolve(process.env.NEARNOTE_BUILD_DIR ?? "build");
    const build = (await import(pathToFileURL(path.join(buildDir, "server/index.js")).href)) as ServerBuild;
    const handler = createRequestHandler(build, "production");
    const origin = "http://127.0.0.1:3000";
    const statuses = await Promise.all(
      guesses().map(async (password) => {
        const body = new URLSearchParams({ email: user.email, password });
        const res = await handler(
          new Request(`${origin}/login`, { method: "POST", body, headers: { Origin: origin } }),
        );
        return res.status;
      }),
    );
    expectThrottled(statuses, "handler");
  });
});
