// The upload page's list of files and what happened to each, as plain data: the same
// shapes describe a row updated by the browser's own request and a row the page's
// no-JavaScript action answered. Pure, so every answer the API gives is tested.
import type { TakeAnalysis } from "~/analysis/types";
import type { FitNotice } from "./exerciseFitText";
import { MAX_TAKE_BYTES } from "./uploadLimits";

export type UploadStage = "ready" | "uploading" | "analysing" | "analysed" | "failed" | "refused" | "duplicate";

export type UploadRow = {
  key: string;
  fileName: string;
  size: number;
  stage: UploadStage;
  /** 0..1 while uploading */
  progress: number;
  takeId: string | null;
  error: string | null;
  chordCount: number | null;
  smoothness: number | null;
  score: number | null;
  /** The file's own exercise: "" (the form's), "free", or "exerciseId|key". */
  choice: string;
  /** Set when the take does not fit the exercise it was filed under. */
  fit: FitNotice | null;
};

export type UploadAnswer = {
  id?: string;
  status?: string;
  error?: string;
  analysis?: Pick<TakeAnalysis, "summary">;
  fit?: FitNotice;
};

export type TakeFieldValues = { exerciseId?: string; key?: string; note?: string };

/**
 * The form's exercise and key with one file's own choice applied: "" keeps the form's, "free"
 * files it as free practice, "exerciseId|key" (or "exerciseId" for its first key) names one.
 */
export function fieldsForChoice<T extends TakeFieldValues>(fields: T, choice: string | undefined): T {
  if (!choice) return fields;
  if (choice === "free") return { ...fields, exerciseId: undefined, key: undefined };
  const [exerciseId, key] = choice.split("|");
  return { ...fields, exerciseId, key: key || undefined };
}

/** Refuses in the browser what the server would refuse anyway, before sending a byte. */
export function precheck(file: { name: string; size: number }): string | null {
  if (!/\.midi?$/i.test(file.name)) return "Only MIDI files (.mid or .midi) can be uploaded.";
  if (file.size > MAX_TAKE_BYTES) return "This file is over 2 MiB; split it into shorter takes.";
  if (file.size === 0) return "This file is empty.";
  return null;
}

export function newRow(key: string, file: { name: string; size: number }): UploadRow {
  const error = precheck(file);
  return {
    key,
    fileName: file.name,
    size: file.size,
    stage: error ? "refused" : "ready",
    progress: 0,
    takeId: null,
    error,
    chordCount: null,
    smoothness: null,
    score: null,
    choice: "",
    fit: null,
  };
}

/** A row for a file the no-JavaScript form posted (its size is not known to the page). */
export function postedRow(key: string, fileName: string): UploadRow {
  return { ...newRow(key, { name: fileName || "Upload", size: 1 }), size: 0, stage: "analysing", error: null };
}

/** What an answer from POST /api/takes (or one result of the page action) means for its row. */
export function rowFromAnswer(row: UploadRow, status: number, body: UploadAnswer | null): UploadRow {
  const base = { ...row, progress: 1, takeId: body?.id ?? null };
  if (status === 201 && body?.analysis) {
    const s = body.analysis.summary;
    return {
      ...base,
      stage: "analysed",
      error: null,
      chordCount: s.chordCount,
      smoothness: s.smoothness,
      score: s.score,
      fit: body.fit ?? null,
    };
  }
  if (status === 409)
    return { ...base, stage: "duplicate", error: body?.error ?? "You have uploaded this take already." };
  if (status === 422)
    return { ...base, stage: "failed", error: body?.error ?? "This MIDI file could not be analysed." };
  if (status === 401)
    return { ...base, stage: "refused", takeId: null, error: "Your session has ended: sign in again, then upload." };
  const fallback =
    status === 413
      ? "This file is over 2 MiB."
      : status === 415
        ? "This is not a MIDI file."
        : `The upload failed (error ${status || "network"}). Try again.`;
  return { ...base, stage: "refused", takeId: null, error: body?.error ?? fallback };
}

export const isFinished = (row: UploadRow) =>
  row.stage !== "ready" && row.stage !== "uploading" && row.stage !== "analysing";

export function formatBytes(n: number): string {
  if (n < 1024) return `${n} B`;
  if (n < 1024 * 1024) return `${(n / 1024).toFixed(1)} KB`;
  return `${(n / 1024 / 1024).toFixed(2)} MB`;
}
