import { useCallback, useEffect, useId, useRef, useState, type DragEvent, type FormEvent } from "react";
import { useActionData, useNavigation } from "react-router";
import type { Route } from "./+types/takes.new";
import { requireStudent } from "~/auth/access.server";
import { Button } from "~/components/Button";
import { Card } from "~/components/Card";
import { PageHeader } from "~/components/PageHeader";
import { PracticeCare } from "~/components/PracticeCare";
import { RecordPanel } from "~/components/record/RecordPanel";
import { ExerciseKeyFields } from "~/components/take/ExerciseKeyFields";
import { UploadRows } from "~/components/take/UploadRows";
import { ExerciseFitNotice, MoveToLikelyForm } from "~/components/upload/ExerciseFitNotice";
import { FileExerciseSelect } from "~/components/upload/FileExerciseSelect";
import { FileGroups } from "~/components/upload/FileGroups";
import { uploadTakesFromForm } from "~/takes/takeUpload.server";
import { MAX_FILES } from "~/takes/uploadLimits";
import { fieldsForChoice, isFinished, newRow, postedRow, rowFromAnswer, type UploadRow } from "~/takes/uploadRows";
import { sendTake } from "~/browser/uploadTake.client";
import { listExercisesForStudent } from "~/models/exercises.server";

export const meta: Route.MetaFunction = () => [{ title: "Upload takes · Nearnote" }];

export async function loader({ request, context }: Route.LoaderArgs) {
  const user = await requireStudent({ request, context });
  const exercises = listExercisesForStudent(user.id, user.active.studioId).map((e) => ({
    id: e.id,
    title: e.title,
    keys: e.keys,
    tempo: e.tempo,
  }));
  const url = new URL(request.url);
  const exerciseId = exercises.some((e) => e.id === url.searchParams.get("exercise"))
    ? url.searchParams.get("exercise")!
    : "";
  const chosen = exercises.find((e) => e.id === exerciseId);
  const key = url.searchParams.get("key") ?? "";
  return { exercises, exerciseId, key: chosen && !chosen.keys.includes(key) ? "" : key };
}

/** Without JavaScript the form posts every file here at once; each gets its own result row. */
export async function action({ request, context }: Route.ActionArgs) {
  const user = await requireStudent({ request, context });
  const results = await uploadTakesFromForm(request, user);
  return {
    rows: results.map((r, i) => rowFromAnswer(postedRow(`posted-${i}`, r.fileName), r.status, r.body)),
  };
}

const CONCURRENT_UPLOADS = 3;

export default function UploadTakes({ loaderData }: Route.ComponentProps) {
  const posted = useActionData<typeof action>();
  const navigation = useNavigation();
  const inputId = useId();
  const form = useRef<HTMLFormElement>(null);
  const files = useRef(new Map<string, File>());
  const counter = useRef(0);
  const [rows, setRows] = useState<UploadRow[]>([]);
  const [dragging, setDragging] = useState(false);
  const [hydrated, setHydrated] = useState(false);
  // The exercise chosen above for every file, so each file's own choice can say what "as above" is.
  const [formExerciseId, setFormExerciseId] = useState(loaderData.exerciseId);
  useEffect(() => setHydrated(true), []);
  const sending = rows.some((r) => r.stage === "uploading" || r.stage === "analysing");
  const ready = rows.filter((r) => r.stage === "ready").length;

  const update = useCallback((key: string, change: (row: UploadRow) => UploadRow) => {
    setRows((all) => all.map((r) => (r.key === key ? change(r) : r)));
  }, []);

  function addFiles(list: FileList | null) {
    if (!list) return;
    const added = Array.from(list).map((file) => {
      const key = `f${++counter.current}`;
      files.current.set(key, file);
      return newRow(key, file);
    });
    setRows((all) => [...all, ...added]);
  }

  async function sendAll(event: FormEvent<HTMLFormElement>) {
    // With JavaScript each file is its own request, with its own progress and answer.
    event.preventDefault();
    const data = new FormData(event.currentTarget);
    const fields = {
      exerciseId: String(data.get("exerciseId") ?? ""),
      key: String(data.get("key") ?? ""),
      note: String(data.get("note") ?? ""),
    };
    const queue = rows.filter((r) => r.stage === "ready");
    const worker = async () => {
      for (let row = queue.shift(); row; row = queue.shift()) {
        const key = row.key;
        const file = files.current.get(key);
        if (!file) continue;
        update(key, (r) => ({ ...r, stage: "uploading", progress: 0 }));
        const answer = await sendTake(file, fieldsForChoice(fields, row.choice), {
          progress: (share) => update(key, (r) => (r.stage === "uploading" ? { ...r, progress: share } : r)),
          uploaded: () => update(key, (r) => ({ ...r, stage: "analysing", progress: 1 })),
        });
        files.current.delete(key);
        update(key, (r) => rowFromAnswer(r, answer.status, answer.body));
      }
    };
    await Promise.all(Array.from({ length: CONCURRENT_UPLOADS }, worker));
  }

  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setDragging(false);
    addFiles(e.dataTransfer.files);
  };

  const shown = rows.length ? rows : (posted?.rows ?? []);
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Upload takes"
        lead="Send the MIDI files of today's practice. Each one is read chord change by chord change, usually in a second or two."
      />
      <form
        ref={form}
        method="post"
        encType="multipart/form-data"
        onSubmit={sendAll}
        onChange={(e) => {
          const field = e.target as unknown as HTMLSelectElement;
          if (field.name === "exerciseId") setFormExerciseId(field.value);
        }}
        className="flex flex-col gap-6"
      >
        <Card title="What these takes are for">
          <div className="flex flex-col gap-4">
            <ExerciseKeyFields
              exercises={loaderData.exercises}
              defaultExerciseId={loaderData.exerciseId}
              defaultKey={loaderData.key}
            />
            <div className="flex flex-col gap-1">
              <label htmlFor={`${inputId}-note`} className="text-sm font-semibold">
                Note for your teacher <span className="font-normal text-ink-soft">(optional)</span>
              </label>
              <textarea
                id={`${inputId}-note`}
                name="note"
                rows={2}
                maxLength={2000}
                placeholder="What you worked on, what felt hard"
                className="rounded-md border border-line bg-white px-3 py-2 text-base shadow-inner focus:border-tide"
              />
            </div>
          </div>
        </Card>

        {/* Sources of a take sit side by side here; a live "Record" panel can join the file panel. */}
        <div className="grid gap-6">
          <Card title="From MIDI files">
            <label
              htmlFor={inputId}
              onDragOver={(e) => {
                e.preventDefault();
                setDragging(true);
              }}
              onDragLeave={() => setDragging(false)}
              onDrop={onDrop}
              className={`flex cursor-pointer flex-col items-center gap-2 rounded-lg border-2 border-dashed px-6 py-8 text-center transition focus-within:outline focus-within:outline-3 focus-within:outline-tide ${
                dragging ? "border-tide bg-tide-pale" : "border-line bg-paper hover:border-tide"
              }`}
            >
              <svg aria-hidden="true" viewBox="0 0 40 28" className="h-7 w-10 text-tide">
                <rect x="1" y="1" width="38" height="26" rx="3" fill="none" stroke="currentColor" strokeWidth="2" />
                {[8, 14, 20, 26, 32].map((x) => (
                  <line key={x} x1={x} y1="1" x2={x} y2="27" stroke="currentColor" strokeWidth="1.5" />
                ))}
                {[6, 12, 24, 30].map((x) => (
                  <rect key={x} x={x - 1.5 + 3} y="1" width="3" height="15" fill="currentColor" />
                ))}
              </svg>
              <span className="font-semibold">Choose MIDI files, or drop them here</span>
              <span className="text-sm text-ink-soft">
                .mid or .midi, up to 2 MiB each; up to {MAX_FILES} at a time without JavaScript
              </span>
              <span
                className={`${hydrated ? "" : "hidden"} mt-2 rounded-md border border-line bg-card px-3 py-2 text-sm font-semibold`}
                aria-hidden="true"
              >
                Choose files
              </span>
              <input
                id={inputId}
                type="file"
                name="files"
                multiple
                accept=".mid,.midi,audio/midi,audio/x-midi"
                aria-label="MIDI files"
                onChange={(e) => {
                  addFiles(e.currentTarget.files);
                  // The rows hold the files now; clearing lets the same file be picked again.
                  e.currentTarget.value = "";
                }}
                // With JavaScript the rows below list the files, so the browser's own "no file chosen" text is hidden.
                className={
                  hydrated
                    ? "sr-only"
                    : "mt-2 w-full max-w-full min-w-0 text-sm file:mr-3 file:rounded-md file:border file:border-line file:bg-card file:px-3 file:py-2 file:font-semibold"
                }
              />
            </label>
            <div className="mt-4 flex flex-col gap-4">
              <UploadRows
                rows={shown}
                onRemove={(key) => setRows((all) => all.filter((r) => r.key !== key))}
                extras={(row) =>
                  row.stage === "ready" && loaderData.exercises.length > 0 ? (
                    <FileExerciseSelect
                      id={`${inputId}-${row.key}-exercise`}
                      fileName={row.fileName}
                      exercises={loaderData.exercises}
                      fallbackTitle={
                        loaderData.exercises.find((e) => e.id === formExerciseId)?.title ?? "free practice"
                      }
                      value={row.choice}
                      onChange={(choice) => update(row.key, (r) => ({ ...r, choice }))}
                    />
                  ) : row.fit && row.takeId ? (
                    <ExerciseFitNotice takeId={row.takeId} notice={row.fit} canMove busy={sending} />
                  ) : null
                }
              />
              {/* Without scripts: groups of files for other exercises, under the results of a post. */}
              <FileGroups exercises={loaderData.exercises} idPrefix={inputId} />
              <div className="flex flex-wrap items-center gap-3">
                <Button
                  pending={sending || navigation.state === "submitting"}
                  pendingLabel="Uploading…"
                  disabled={hydrated && ready === 0}
                >
                  {ready > 1 ? `Upload ${ready} takes` : "Upload"}
                </Button>
                {rows.length > 0 && rows.every(isFinished) ? (
                  <span className="text-sm text-ink-soft" role="status">
                    All done. Open a take to read it change by change.
                  </span>
                ) : null}
              </div>
            </div>
          </Card>
          {/* Reads this form's exercise, key and note when it uploads; starts at a preselected exercise's tempo. */}
          <RecordPanel tempo={loaderData.exercises.find((e) => e.id === loaderData.exerciseId)?.tempo} />
        </div>
      </form>
      {/* The forms that move a take to its likely exercise sit outside the upload form (no nesting). */}
      {shown.map((row) =>
        row.fit && row.takeId ? <MoveToLikelyForm key={row.key} takeId={row.takeId} notice={row.fit} /> : null,
      )}
      <PracticeCare />
    </div>
  );
}
