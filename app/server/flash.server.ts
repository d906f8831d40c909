import { createCookieSessionStorage } from "react-router";
import type { FlashTone } from "~/utils/flashTone";
import { env } from "~/server/env.server";

export type Flash = { tone: FlashTone; message: string };

let storage: ReturnType<typeof createCookieSessionStorage<Record<string, never>, { flash: Flash }>> | undefined;

function flashStorage() {
  storage ??= createCookieSessionStorage<Record<string, never>, { flash: Flash }>({
    cookie: {
      name: "nearnote_flash",
      httpOnly: true,
      sameSite: "lax",
      secure: env().secureCookies,
      path: "/",
      secrets: [env().sessionSecret],
    },
  });
  return storage;
}

/** A Set-Cookie header that shows `message` once on the next page. */
export async function flashHeader(request: Request, flash: Flash) {
  const s = flashStorage();
  const session = await s.getSession(request.headers.get("Cookie"));
  session.flash("flash", flash);
  return s.commitSession(session);
}

/** Reads (and clears) the pending flash message. */
export async function readFlash(request: Request) {
  const s = flashStorage();
  const session = await s.getSession(request.headers.get("Cookie"));
  const flash = session.get("flash") ?? null;
  return { flash, header: flash ? await s.commitSession(session) : null };
}
