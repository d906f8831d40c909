import { LocalFileStorage } from "@mjackson/file-storage/local";
import { LRUCache } from "lru-cache";
import { createHash, randomUUID } from "node:crypto";
import { mkdir, readdir, rm, stat, unlink, writeFile } from "node:fs/promises";
import path from "node:path";
import { readMidi, type NoteEvent, type PedalSpan } from "~/analysis";
import { env } from "~/server/env.server";

// Take files live under storage/takes/ by a random key: the client's file name
// is kept in the database only, never used in a path.
const stores = new Map<string, LocalFileStorage>();

export function takesDir(storageDir = env().storageDir) {
  return path.join(storageDir, "takes");
}

export function takeStorage(): LocalFileStorage {
  const dir = takesDir();
  let store = stores.get(dir);
  if (!store) {
    store = new LocalFileStorage(dir);
    stores.set(dir, store);
  }
  return store;
}

export function newFileKey() {
  return randomUUID();
}

export async function readTakeFile(fileKey: string): Promise<Uint8Array | null> {
  const file = await takeStorage().get(fileKey);
  return file ? new Uint8Array(await file.arrayBuffer()) : null;
}

export async function removeTakeFile(fileKey: string) {
  takeNotes.delete(path.join(takesDir(), fileKey));
  await takeStorage().remove(fileKey);
}

export type TakeNotes = { notes: NoteEvent[]; pedal: PedalSpan[] };

/**
 * Notes and pedal read from take files, by folder and key, bounded by their count. A key is
 * written once (every upload and replacement gets a new one), so what it holds never changes.
 */
const takeNotes = new LRUCache<string, TakeNotes>({ maxSize: 1_000_000 });

/**
 * The notes and pedal of a stored take file (null: no such file), read and parsed once and
 * then shared (frozen): the take page and its windows draw them on every view.
 */
export async function readTakeNotes(fileKey: string): Promise<TakeNotes | null> {
  const cacheKey = path.join(takesDir(), fileKey);
  const known = takeNotes.get(cacheKey);
  if (known) return known;
  const bytes = await readTakeFile(fileKey);
  if (!bytes) return null;
  const { notes, pedal = [] } = readMidi(bytes);
  for (const n of notes) Object.freeze(n);
  for (const p of pedal) Object.freeze(p);
  const read = Object.freeze({ notes: Object.freeze(notes), pedal: Object.freeze(pedal) }) as TakeNotes;
  takeNotes.set(cacheKey, read, { size: notes.length + pedal.length + 1 });
  return read;
}

/**
 * Removes files whose rows are already gone. A file that cannot be removed now
 * (a read-only folder, say) is left for the orphan sweep rather than failing a
 * deletion the database has already made.
 */
export async function removeTakeFilesAfterRows(fileKeys: string[]) {
  for (const key of fileKeys) {
    try {
      await removeTakeFile(key);
    } catch (e) {
      console.warn(`[nearnote] could not remove a take file now, the orphan sweep will: ${(e as Error).message}`);
    }
  }
}

/**
 * Where LocalFileStorage keeps a key, relative to the takes folder: `<h0h1>/<h>.dat`
 * and `<h0h1>/<h>.meta.json`, h being the SHA-256 of the key in hex.
 */
export function takeFileNames(fileKey: string) {
  const hash = createHash("sha256").update(fileKey).digest("hex");
  return { hash, dat: `${hash.slice(0, 2)}/${hash}.dat`, meta: `${hash.slice(0, 2)}/${hash}.meta.json` };
}

/** Every stored file under the takes folder, by the hash its name carries. */
export async function listStoredTakeFiles(dir = takesDir()) {
  const found: { hash: string; file: string; mtimeMs: number }[] = [];
  let subdirs: string[];
  try {
    subdirs = await readdir(dir);
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === "ENOENT") return found;
    throw e;
  }
  for (const sub of subdirs) {
    const subPath = path.join(dir, sub);
    let names: string[];
    try {
      names = await readdir(subPath);
    } catch {
      continue; // a plain file or a folder gone meanwhile
    }
    for (const name of names) {
      const m = /^([0-9a-f]{64})\.(dat|meta\.json)$/.exec(name);
      if (!m) continue;
      const file = path.join(subPath, name);
      const s = await stat(file).catch(() => null);
      if (s) found.push({ hash: m[1], file, mtimeMs: s.mtimeMs });
    }
  }
  return found;
}

/** Removes a stored file that no row names; a file already gone counts as removed. */
export async function removeStoredFile(file: string) {
  await rm(file, { force: true });
}

/** Whether new take files can be written right now (for /healthz). */
export async function takesFolderWritable(): Promise<boolean> {
  const probe = path.join(takesDir(), `.healthz-${randomUUID()}`);
  try {
    await mkdir(takesDir(), { recursive: true });
    await writeFile(probe, "ok");
    await unlink(probe);
    return true;
  } catch {
    await rm(probe, { force: true }).catch(() => {});
    return false;
  }
}
