// "Never uploaded twice": the recorder may send its take again only when the server stored
// nothing. Statuses are POST /api/takes's documented answers (app/routes/api.takes.ts).
import { describe, expect, it } from "vitest";
import { canRetry } from "~/components/record/useRecordingUpload";

describe("canRetry", () => {
  it("allows another send only after a dropped connection, an ended session or a server fault", () => {
    for (const status of [0, 401, 500, 503]) expect(canRetry(status), String(status)).toBe(true);
  });
  it("never after the take was stored, or refused for what it is", () => {
    // 201 analysed, 422 stored but not analysed, 409 the same bytes already stored,
    // 413 too large, 415 not a MIDI file, 400 unreadable, 403 not a student.
    for (const status of [201, 422, 409, 413, 415, 400, 403]) expect(canRetry(status), String(status)).toBe(false);
  });
});
