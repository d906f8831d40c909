// The teacher's model take of an exercise: one MIDI file per exercise, uploaded, replaced,
// removed and played back in the browser.
import { AnalysisError, readMidi } from "~/analysis";
import { db } from "~/db/client.server";
import { exercises, type Exercise } from "~/db/schema";
import { readNotesInWorker } from "~/takes/analysisPool.server";
import { readTakeFile, removeTakeFile, removeTakeFilesAfterRows } from "~/takes/takeFiles.server";
import { receiveUpload, UploadRefused } from "~/takes/takeUpload.server";
import { eq } from "drizzle-orm";

/**
 * Points the exercise at another model file (or none), then removes the file it displaced:
 * the row first, then the file (a file without a row is swept; a row without its file is a
 * broken page). Of two uploads racing, each removes the file it displaced.
 */
async function swapModelFile(exerciseId: string, next: { fileKey: string; name: string } | null) {
  const previous = db().transaction((tx) => {
    const row = tx.select({ key: exercises.modelFileKey }).from(exercises).where(eq(exercises.id, exerciseId)).get();
    tx.update(exercises)
      .set({ modelFileKey: next?.fileKey ?? null, modelOriginalName: next?.name ?? null })
      .where(eq(exercises.id, exerciseId))
      .run();
    return row?.key ?? null;
  });
  if (previous) await removeTakeFilesAfterRows([previous]);
}

/** Drops the teacher's model take (file and columns). */
export async function removeModelTake(exercise: Pick<Exercise, "id" | "modelFileKey">) {
  await swapModelFile(exercise.id, null);
}

/**
 * Stores the teacher's model take from a multipart upload (field `file`), replacing the one
 * before. Returns an error message for the teacher, or null when it was saved.
 */
export async function storeModelTake(
  request: Request,
  exercise: Pick<Exercise, "id" | "modelFileKey">,
): Promise<string | null> {
  let files;
  try {
    ({ files } = await receiveUpload(request, { maxFiles: 1, defaultName: "model.mid" }));
  } catch (e) {
    if (e instanceof UploadRefused) return "The file could not be read: choose one MIDI file under 2 MiB.";
    throw e;
  }
  const [file, ...others] = files.filter((f) => f.fieldName === "file");
  await Promise.all([...files.filter((f) => f.fieldName !== "file"), ...others].map((f) => removeTakeFile(f.fileKey)));
  if (!file) return "Choose a MIDI file to attach.";
  const saved = { fileKey: file.fileKey, name: file.originalName };
  try {
    const bytes = await readTakeFile(saved.fileKey);
    const checked = bytes
      ? await readNotesInWorker(bytes)
      : ({ ok: false, error: new AnalysisError("no-notes").message } as const);
    if (!checked.ok) {
      await removeTakeFile(saved.fileKey);
      return `This is not a MIDI take Nearnote can play: ${checked.error}`;
    }
    await swapModelFile(exercise.id, saved);
    return null;
  } catch (e) {
    await removeTakeFile(saved.fileKey).catch(() => {});
    throw e;
  }
}

/** The model take's notes for playing in the browser, or null when there is none. */
export async function modelTakeNotes(exercise: Pick<Exercise, "modelFileKey" | "modelOriginalName">) {
  if (!exercise.modelFileKey) return null;
  const bytes = await readTakeFile(exercise.modelFileKey);
  if (!bytes) return null;
  try {
    return { name: exercise.modelOriginalName ?? "model.mid", notes: readMidi(bytes).notes };
  } catch {
    return null;
  }
}
