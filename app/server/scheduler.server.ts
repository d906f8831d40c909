import { runScheduledMail } from "~/models/digest.server";

// A small scheduler inside the server process: every few minutes it sends what is due (the
// teachers' daily digests, due-date reminders). What it sent is recorded in `sent_mails`
// before sending, so a restart, or two overlapping ticks, never send a mail twice.

export const TICK_MS = 5 * 60_000;

let timer: ReturnType<typeof setInterval> | null = null;
let running = false;

export async function tick(now = new Date()) {
  if (running) return null;
  running = true;
  try {
    const result = await runScheduledMail(now);
    if (result.digests || result.reminders) {
      console.log(`[nearnote] scheduler sent ${result.digests} digest(s) and ${result.reminders} due-date reminder(s)`);
    }
    return result;
  } catch (e) {
    console.error("[nearnote] scheduled mail failed; it is tried again on the next tick:", e);
    return null;
  } finally {
    running = false;
  }
}

export function startScheduler(intervalMs = TICK_MS) {
  // Tests call `tick` with the moment they want; a timer there would outlive each test's database.
  if (timer || process.env.VITEST) return;
  timer = setInterval(() => void tick(), intervalMs);
  timer.unref();
  // A first run shortly after start, so a digest due while the server was down goes out.
  setTimeout(() => void tick(), 5_000).unref();
}

export function stopScheduler() {
  if (timer) clearInterval(timer);
  timer = null;
}
