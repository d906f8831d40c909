import { useCallback, useRef, useState } from "react";
import { newRow, rowFromAnswer, type UploadRow } from "~/takes/uploadRows";
import { sendTake, type TakeFields } from "~/browser/uploadTake.client";

/** Answers after which sending the same bytes again makes sense: nothing was stored. */
export function canRetry(status: number): boolean {
  return status === 0 || status === 401 || status >= 500;
}

/**
 * Sends one recording through POST /api/takes exactly as the upload page sends a file, with
 * the same row of progress and result. A recording is sent at most once: the guard is a ref
 * (set before the first await, so a double click cannot slip through) and is released only
 * when the server stored nothing; the server's 409 for identical bytes is the safety net.
 */
export function useRecordingUpload(onUploaded?: (takeId: string) => void) {
  const [row, setRow] = useState<UploadRow | null>(null);
  const sending = useRef(false);
  const sent = useRef(false);
  const [done, setDone] = useState(false);

  const upload = useCallback(
    async (file: File, fields: TakeFields) => {
      if (sending.current || sent.current) return;
      sending.current = true;
      const start = newRow("recording", file);
      if (start.stage === "refused") {
        sending.current = false;
        setRow(start);
        return;
      }
      setRow({ ...start, stage: "uploading" });
      const answer = await sendTake(file, fields, {
        progress: (share) => setRow((r) => (r && r.stage === "uploading" ? { ...r, progress: share } : r)),
        uploaded: () => setRow((r) => (r ? { ...r, stage: "analysing", progress: 1 } : r)),
      });
      sending.current = false;
      const result = rowFromAnswer(start, answer.status, answer.body);
      setRow(result);
      if (!canRetry(answer.status)) {
        sent.current = true;
        setDone(true);
        if (result.takeId && (answer.status === 201 || answer.status === 422)) onUploaded?.(result.takeId);
      }
    },
    [onUploaded],
  );

  /** A new recording starts a new row. */
  const reset = useCallback(() => {
    if (sending.current) return;
    sent.current = false;
    setDone(false);
    setRow(null);
  }, []);

  return { row, done, upload, reset, busy: row?.stage === "uploading" || row?.stage === "analysing" };
}
