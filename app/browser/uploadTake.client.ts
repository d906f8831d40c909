// Sends one take to POST /api/takes with XMLHttpRequest, because fetch() gives no upload
// progress. Browser only.
import type { UploadAnswer } from "~/takes/uploadRows";

export type TakeFields = { exerciseId?: string; key?: string; note?: string };

export function sendTake(
  file: File,
  fields: TakeFields,
  on: { progress: (share: number) => void; uploaded: () => void },
): Promise<{ status: number; body: UploadAnswer | null }> {
  return new Promise((resolve) => {
    const form = new FormData();
    form.append("file", file, file.name);
    if (fields.exerciseId) form.append("exerciseId", fields.exerciseId);
    if (fields.key) form.append("key", fields.key);
    if (fields.note) form.append("note", fields.note);
    // The file's own date, as the browser reports it; the server falls back to the upload time.
    if (file.lastModified) form.append("recordedAt", new Date(file.lastModified).toISOString());
    const xhr = new XMLHttpRequest();
    xhr.open("POST", "/api/takes");
    xhr.responseType = "json";
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) on.progress(e.loaded / e.total);
    };
    xhr.upload.onload = () => on.uploaded();
    xhr.onload = () => resolve({ status: xhr.status, body: (xhr.response as UploadAnswer | null) ?? null });
    xhr.onerror = () =>
      resolve({ status: 0, body: { error: "The connection dropped. Check your network and try again." } });
    xhr.send(form);
  });
}
