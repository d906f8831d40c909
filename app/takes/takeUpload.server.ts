import {
  FormDataParseError,
  MaxFileSizeExceededError,
  MaxFilesExceededError,
  MaxTotalSizeExceededError,
  MultipartParseError,
  parseFormData,
  type FileUpload,
} from "@remix-run/form-data-parser";
import { createHash } from "node:crypto";
import { and, eq } from "drizzle-orm";
import { z } from "zod";
import { ProgressionError, type TakeAnalysis } from "~/analysis";
import { fitWarning, type FitCandidate } from "~/analysis/exerciseFit";
import { parseKey } from "~/analysis/pitch";
import type { SessionUser } from "~/auth/session.server";
import { db } from "~/db/client.server";
import { takes, type Take } from "~/db/schema";
import { targetTextForKey } from "~/utils/exerciseProgression";
import { fitNotice, type FitNotice } from "~/takes/exerciseFitText";
import { analyseInWorker } from "~/takes/analysisPool.server";
import { newFileKey, removeTakeFile, removeTakeFilesAfterRows, takeStorage } from "~/takes/takeFiles.server";
import { MAX_FILES, MAX_TAKE_BYTES } from "~/takes/uploadLimits";
import { fieldsForChoice } from "~/takes/uploadRows";
import { listExercisesForStudent, type ExerciseOption } from "~/models/exercises.server";
import { createTakeRecord, replaceTakeRecord } from "~/models/takes.server";

// One module for every way a take arrives: the API route, the upload page's
// no-JavaScript form, "replace this take", and the teacher's model take of an exercise.
const MIDI_SIGNATURE = [0x4d, 0x54, 0x68, 0x64]; // "MThd", Standard MIDI File 1.0 header chunk

export type UploadBody = {
  id?: string;
  status?: "analysed" | "failed";
  error?: string;
  analysis?: TakeAnalysis;
  fit?: FitNotice;
};
export type UploadResult = { status: number; body: UploadBody; fileName: string };

export type Stored = { fieldName: string; fileKey: string; originalName: string; lastModified: number };

/** A refused upload: the HTTP status and the words to show; nothing of the request is kept. */
export class UploadRefused extends Error {
  constructor(
    readonly status: number,
    message: string,
  ) {
    super(message);
  }
}

const fieldsSchema = z.object({
  exerciseId: z
    .string()
    .trim()
    .max(64)
    .optional()
    .transform((v) => v || undefined),
  key: z
    .string()
    .trim()
    .max(8)
    .optional()
    .transform((v) => v || undefined),
  recordedAt: z
    .string()
    .trim()
    .max(40)
    .optional()
    .transform((v) => v || undefined),
  note: z.string().max(2000, "Keep the note under 2,000 characters.").optional().default(""),
});
type UploadFields = z.infer<typeof fieldsSchema>;

/**
 * Parses the multipart body, storing each file under storage/takes/ by a random key
 * (at most `maxFiles`, each up to MAX_TAKE_BYTES). On any refusal it throws
 * `UploadRefused` after removing every file already stored from this request.
 */
export async function receiveUpload(
  request: Request,
  { maxFiles = MAX_FILES, defaultName = "take.mid" }: { maxFiles?: number; defaultName?: string } = {},
): Promise<{ form: FormData; files: Stored[] }> {
  const type = request.headers.get("content-type") ?? "";
  if (!type.startsWith("multipart/form-data")) {
    throw new UploadRefused(400, "Send the take as a multipart/form-data upload with a file field.");
  }
  const declared = Number(request.headers.get("content-length") ?? "0");
  if (declared > maxFiles * MAX_TAKE_BYTES + 1024 * 1024) {
    throw new UploadRefused(413, tooBig());
  }
  const files: Stored[] = [];
  try {
    const form = await parseFormData(request, { maxFileSize: MAX_TAKE_BYTES, maxFiles }, async (file: FileUpload) => {
      if (!file.name && file.size === 0) return null; // an empty file input
      const fileKey = newFileKey();
      files.push({
        fieldName: file.fieldName,
        fileKey,
        originalName: cleanName(file.name, defaultName),
        lastModified: file.lastModified,
      });
      await takeStorage().put(fileKey, file);
      return fileKey;
    });
    return { form, files };
  } catch (e) {
    await Promise.all(files.map((f) => removeTakeFile(f.fileKey)));
    if (e instanceof MaxFileSizeExceededError || e instanceof MaxTotalSizeExceededError)
      throw new UploadRefused(413, tooBig());
    if (e instanceof MaxFilesExceededError) throw new UploadRefused(413, `Send at most ${maxFiles} files at once.`);
    if (e instanceof FormDataParseError || e instanceof MultipartParseError || isMalformedText(e)) {
      throw new UploadRefused(400, "The upload could not be read; try sending the file again.");
    }
    throw e;
  }
}

/** A part header that is not valid UTF-8 makes the parser's strict text decoder throw. */
function isMalformedText(e: unknown) {
  return e instanceof TypeError && (e as NodeJS.ErrnoException).code === "ERR_ENCODING_INVALID_ENCODED_DATA";
}

function tooBig() {
  return "This file is over 2 MiB; a take that large is more than Nearnote grades. Split it into shorter takes.";
}

/** Keeps the client's name for display only: no path, no control characters. */
export function cleanName(name: string, fallback = "take.mid"): string {
  const base = name.split(/[\\/]/).pop() ?? "";
  const clean = base
    .replace(/[\u0000-\u001f\u007f]/g, "")
    .trim()
    .slice(0, 200);
  return clean || fallback;
}

function parseRecordedAt(value: string | undefined, fallback: number | undefined): Date {
  const now = Date.now();
  const candidates = [value ? (/^\d+$/.test(value) ? Number(value) : Date.parse(value)) : NaN, fallback ?? NaN];
  for (const t of candidates) {
    // A date from before MIDI existed or from the future is a broken clock: use the upload time.
    if (Number.isFinite(t) && t > Date.UTC(1983, 0, 1) && t <= now + 86_400_000) return new Date(t);
  }
  return new Date(now);
}

/** Every open exercise of the student in each of its keys, as the engine compares a take with them. */
function fitCandidatesOf(exercises: readonly ExerciseOption[]): FitCandidate[] {
  return exercises.flatMap((e) =>
    e.keys.map((key) => ({ exerciseId: e.id, key, target: targetTextForKey(e.progression, e.keys, key) })),
  );
}

/** Where an ingested file goes: a new take in a studio, or in place of an existing take. */
type Destination = { studioId: string; replacing?: { id: string; fileKey: string } };

/** Checks, analyses and saves one stored file for the student; every refusal removes the file. */
async function ingest(user: SessionUser, file: Stored, fields: UploadFields, to: Destination): Promise<UploadResult> {
  const fileName = file.originalName;
  const studioId = to.studioId;
  const fail = async (status: number, error: string, extra: UploadBody = {}): Promise<UploadResult> => {
    await removeTakeFile(file.fileKey);
    return { status, body: { error, ...extra }, fileName };
  };
  try {
    const stored = await takeStorage().get(file.fileKey);
    const bytes = stored ? new Uint8Array(await stored.arrayBuffer()) : new Uint8Array();
    if (bytes.length < 4 || MIDI_SIGNATURE.some((b, i) => bytes[i] !== b)) {
      return fail(415, "This is not a MIDI file: save or export the take as a Standard MIDI File (.mid).");
    }
    const contentHash = createHash("sha256").update(bytes).digest("hex");
    const existing = db()
      .select({ id: takes.id })
      .from(takes)
      .where(and(eq(takes.studentId, user.id), eq(takes.contentHash, contentHash)))
      .get();
    if (existing) return fail(409, "You have uploaded this take already.", { id: existing.id });

    let key = fields.key ?? null;
    let target: string | undefined;
    let candidates: FitCandidate[] | undefined;
    const open = fields.exerciseId ? listExercisesForStudent(user.id, studioId) : [];
    if (fields.exerciseId) {
      const exercise = open.find((e) => e.id === fields.exerciseId);
      if (!exercise) return fail(400, "That exercise is not one of yours.");
      key ??= exercise.keys[0] ?? null;
      if (key && !exercise.keys.includes(key))
        return fail(400, `This exercise is set in ${exercise.keys.join(", ")}, not ${key}.`);
      target = targetTextForKey(exercise.progression, exercise.keys, key);
      candidates = fitCandidatesOf(open);
    }
    if (key) {
      try {
        parseKey(key);
      } catch (e) {
        if (e instanceof ProgressionError)
          return fail(400, `"${key}" is not a key Nearnote knows (try D, Ab, F# or Gm).`);
        throw e;
      }
    }

    const outcome = await analyseInWorker(bytes, { key, target, candidates });
    const warning =
      outcome.ok && outcome.fit && fields.exerciseId
        ? fitWarning(outcome.fit, { exerciseId: fields.exerciseId, key })
        : null;
    const record = {
      exerciseId: fields.exerciseId ?? null,
      key,
      note: fields.note,
      fileKey: file.fileKey,
      originalName: fileName,
      size: bytes.length,
      contentHash,
      recordedAt: parseRecordedAt(fields.recordedAt, file.lastModified),
      exerciseFit: warning,
      outcome,
    };
    let id: string;
    try {
      if (to.replacing) {
        const replaced = replaceTakeRecord(to.replacing.id, to.replacing.fileKey, record);
        if (!replaced)
          return fail(409, "This take was replaced or deleted meanwhile; open it again to see what it holds now.");
        await removeTakeFilesAfterRows([replaced]);
        id = to.replacing.id;
      } else {
        id = createTakeRecord({ studentId: user.id, studioId, ...record });
      }
    } catch (e) {
      // The same content arriving twice at once: the unique index decides.
      if (e instanceof Error && /UNIQUE constraint failed: takes\.student_id/.test(e.message)) {
        const twin = db()
          .select({ id: takes.id })
          .from(takes)
          .where(and(eq(takes.studentId, user.id), eq(takes.contentHash, contentHash)))
          .get();
        return fail(409, "You have uploaded this take already.", { id: twin?.id });
      }
      throw e;
    }
    const titles = new Map(open.map((e) => [e.id, e.title]));
    const fit = fitNotice(warning, titles.get(fields.exerciseId ?? "") ?? "", titles);
    return outcome.ok
      ? { status: 201, body: { id, status: "analysed", analysis: outcome.analysis, ...(fit ? { fit } : {}) }, fileName }
      : { status: 422, body: { id, status: "failed", error: outcome.error }, fileName };
  } catch (e) {
    // Nothing refers to the file yet: an unexpected error must not leave it behind.
    await removeTakeFile(file.fileKey).catch(() => {});
    throw e;
  }
}

async function readFields(form: FormData, files: Stored[]) {
  const parsed = fieldsSchema.safeParse({
    exerciseId: form.get("exerciseId") ?? undefined,
    key: form.get("key") ?? undefined,
    recordedAt: form.get("recordedAt") ?? undefined,
    note: form.get("note") ?? undefined,
  });
  if (!parsed.success) {
    await Promise.all(files.map((f) => removeTakeFile(f.fileKey)));
    throw new UploadRefused(400, parsed.error.issues[0].message);
  }
  return parsed.data;
}

function refusal(e: unknown, fileName = ""): UploadResult {
  if (e instanceof UploadRefused) return { status: e.status, body: { error: e.message }, fileName };
  throw e;
}

/** POST /api/takes: exactly one file in the field `file`. */
export async function uploadOneTake(request: Request, user: SessionUser): Promise<UploadResult> {
  try {
    const { form, files } = await receiveUpload(request);
    const fields = await readFields(form, files);
    const mine = files.filter((f) => f.fieldName === "file");
    if (mine.length !== 1 || files.length !== 1) {
      await Promise.all(files.map((f) => removeTakeFile(f.fileKey)));
      throw new UploadRefused(400, mine.length === 0 ? "Choose a MIDI file to upload." : "Send one file per request.");
    }
    return await ingest(user, mine[0], fields, { studioId: user.active!.studioId });
  } catch (e) {
    return refusal(e);
  }
}

/** One file's own exercise: "exerciseId|key", "exerciseId", "free" (no exercise) or "" (the form's). */
const fileExerciseSchema = z
  .string()
  .trim()
  .max(80)
  .regex(/^(|free|[^|]+(\|[^|]{1,8})?)$/, "Choose an exercise for each file from the list.");

/** A group of files of the page's no-JavaScript form: field `file-N`, its exercise in `exercise-N`. */
const GROUP_FILE = /^file-(\d{1,2})$/;

/**
 * Each stored file's own exercise choice: the n-th file of the field `files` takes the n-th
 * `fileExercise` value; a file of a group field `file-N` takes that group's `exercise-N`.
 */
function choicesOf(form: FormData, files: Stored[]) {
  const listed = form.getAll("fileExercise").map(String);
  let n = 0;
  const raw = files.map((f) => {
    const group = GROUP_FILE.exec(f.fieldName);
    if (group) return String(form.get(`exercise-${group[1]}`) ?? "");
    return f.fieldName === "files" ? (listed[n++] ?? "") : "";
  });
  if (listed.length > n) return z.array(fileExerciseSchema).max(n).safeParse(listed);
  return z.array(fileExerciseSchema).safeParse(raw);
}

/**
 * The upload page's form: up to ten files, one result each. Each file may go to its own
 * exercise: the n-th `fileExercise` value belongs to the n-th file of the field `files`, and
 * without JavaScript the page sends groups of files (`file-N`), each with its exercise (`exercise-N`).
 */
export async function uploadTakesFromForm(request: Request, user: SessionUser): Promise<UploadResult[]> {
  try {
    const { form, files } = await receiveUpload(request);
    const fields = await readFields(form, files);
    if (files.length === 0) throw new UploadRefused(400, "Choose one or more MIDI files to upload.");
    const choices = choicesOf(form, files);
    if (!choices.success) {
      await Promise.all(files.map((f) => removeTakeFile(f.fileKey)));
      throw new UploadRefused(400, choices.error.issues[0].message);
    }
    const results: UploadResult[] = [];
    for (const [i, f] of files.entries()) {
      try {
        results.push(
          await ingest(user, f, fieldsForChoice(fields, choices.data[i]), { studioId: user.active!.studioId }),
        );
      } catch (e) {
        // The files not reached yet have no row either.
        await Promise.all(files.slice(i + 1).map((rest) => removeTakeFile(rest.fileKey).catch(() => {})));
        throw e;
      }
    }
    return results;
  } catch (e) {
    return [refusal(e)];
  }
}

/**
 * Replaces a take with a new recording, in place and in the take's own studio
 * (whichever studio is active): the new file keeps the take's exercise, key and
 * note unless the form gives others, and the take keeps its comments, review
 * state and intended-flag marks. The old file goes once the new one is saved.
 */
export async function replaceTakeFromForm(request: Request, user: SessionUser, take: Take): Promise<UploadResult> {
  try {
    const { form, files } = await receiveUpload(request);
    const fields = await readFields(form, files);
    if (files.length !== 1) {
      await Promise.all(files.map((f) => removeTakeFile(f.fileKey)));
      throw new UploadRefused(400, "Choose one MIDI file to replace this take with.");
    }
    return await ingest(
      user,
      files[0],
      {
        exerciseId: fields.exerciseId ?? take.exerciseId ?? undefined,
        key: fields.key ?? take.key ?? undefined,
        recordedAt: fields.recordedAt,
        note: fields.note || take.note || "",
      },
      { studioId: take.studioId, replacing: { id: take.id, fileKey: take.fileKey } },
    );
  } catch (e) {
    return refusal(e);
  }
}
