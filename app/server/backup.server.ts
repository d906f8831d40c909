import Database from "better-sqlite3";
import { Zip, ZipPassThrough, unzipSync } from "fflate";
import { createWriteStream, existsSync, mkdirSync, renameSync, rmSync, writeFileSync } from "node:fs";
import { mkdtemp, open, type FileHandle } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { takeFileNames } from "~/takes/takeFiles.server";

// A backup is one ZIP file: `nearnote.db` (SQLite's online backup, consistent even
// while the app writes) and `takes/…` (the take files that copy of the database
// refers to, copied afterwards).

/** File keys the database copy refers to: takes and the exercises' model takes. */
function fileKeysIn(dbFile: string): string[] {
  const copy = new Database(dbFile, { readonly: true });
  try {
    const rows = copy
      .prepare(
        "select file_key as k from takes union select model_file_key from exercises where model_file_key is not null",
      )
      .all() as { k: string }[];
    return rows.map((r) => r.k);
  } finally {
    copy.close();
  }
}

async function addOpenFile(zip: Zip, name: string, handle: FileHandle) {
  const entry = new ZipPassThrough(name);
  zip.add(entry);
  for await (const chunk of handle.createReadStream({ autoClose: false, start: 0 }))
    entry.push(new Uint8Array(chunk as Buffer));
  entry.push(new Uint8Array(0), true);
}

/** Opens both files of a stored take; null when either is gone (the take was deleted meanwhile). */
async function openPair(files: string[]): Promise<FileHandle[] | null> {
  const handles: FileHandle[] = [];
  try {
    for (const f of files) handles.push(await open(f, "r"));
    return handles;
  } catch (e) {
    await Promise.all(handles.map((h) => h.close()));
    if ((e as NodeJS.ErrnoException).code === "ENOENT") return null;
    throw e;
  }
}

export type BackupResult = { destination: string; takeFiles: number; skipped: string[] };

export async function writeBackup(
  sqlite: Database.Database,
  storageDir: string,
  destination: string,
  note: (message: string) => void = console.warn,
): Promise<BackupResult> {
  const work = await mkdtemp(path.join(tmpdir(), "nearnote-backup-"));
  mkdirSync(path.dirname(destination), { recursive: true });
  const partial = `${destination}.partial`;
  try {
    const dbCopy = path.join(work, "nearnote.db");
    await sqlite.backup(dbCopy);
    const takesDir = path.join(storageDir, "takes");
    const keys = fileKeysIn(dbCopy);
    const out = createWriteStream(partial);
    const done = new Promise<void>((resolve, reject) => {
      out.on("finish", resolve);
      out.on("error", reject);
    });
    const zip = new Zip((err, chunk, final) => {
      if (err) return out.destroy(err);
      out.write(chunk);
      if (final) out.end();
    });
    const dbHandle = await open(dbCopy, "r");
    try {
      await addOpenFile(zip, "nearnote.db", dbHandle);
    } finally {
      await dbHandle.close();
    }
    let takeFiles = 0;
    const skipped: string[] = [];
    for (const key of keys) {
      const { dat, meta } = takeFileNames(key);
      // Opened before they are added: a take deleted now either is copied whole or skipped.
      const handles = await openPair([path.join(takesDir, dat), path.join(takesDir, meta)]);
      if (!handles) {
        skipped.push(key);
        note(`[nearnote] backup: the file of take ${key} vanished (deleted while the backup ran); skipped`);
        continue;
      }
      try {
        await addOpenFile(zip, `takes/${dat}`, handles[0]);
        await addOpenFile(zip, `takes/${meta}`, handles[1]);
        takeFiles += 2;
      } finally {
        await Promise.all(handles.map((h) => h.close()));
      }
    }
    zip.end();
    await done;
    renameSync(partial, destination); // only a complete archive carries the final name
    return { destination, takeFiles, skipped };
  } catch (e) {
    rmSync(partial, { force: true });
    throw e;
  } finally {
    rmSync(work, { recursive: true, force: true });
  }
}

const SQLITE_HEADER = "SQLite format 3\0"; // the first 16 bytes of every SQLite 3 database file (sqlite.org/fileformat.html)

/** An entry under takes/ that stays inside the takes folder: plain relative segments only. */
function safeTakePath(name: string): string | null {
  const rel = name.slice("takes/".length);
  const parts = rel.split("/");
  if (!rel || rel.includes("\\") || parts.some((p) => p === "" || p === "." || p === ".." || /[\u0000-\u001f]/.test(p)))
    return null;
  return rel;
}

/**
 * Puts a backup back: the database file (WAL files removed) and the take files.
 * The whole archive is checked first; nothing is touched unless all of it is
 * sound. Stop the app first.
 */
export function restoreBackup(archive: Uint8Array, databasePath: string, storageDir: string) {
  let entries: Record<string, Uint8Array>;
  try {
    entries = unzipSync(archive);
  } catch {
    throw new Error("This file is not a Nearnote backup (not a readable ZIP archive).");
  }
  const db = entries["nearnote.db"];
  if (!db) throw new Error("This file is not a Nearnote backup (no nearnote.db inside).");
  if (new TextDecoder().decode(db.subarray(0, 16)) !== SQLITE_HEADER)
    throw new Error("This backup's nearnote.db is not a SQLite database.");
  const takeEntries: [string, Uint8Array][] = [];
  for (const [name, bytes] of Object.entries(entries)) {
    if (name === "nearnote.db") continue;
    if (name.startsWith("takes/") && name.endsWith("/")) continue; // a folder entry
    const rel = name.startsWith("takes/") ? safeTakePath(name) : null;
    if (!rel)
      throw new Error(
        `Refusing this backup: the entry ${JSON.stringify(name)} is not a take file inside takes/. Nothing was changed.`,
      );
    takeEntries.push([rel, bytes]);
  }

  // Stage everything beside its final place, then swap.
  const takesDir = path.join(storageDir, "takes");
  const staging = `${takesDir}.restoring`;
  const stagedDb = `${databasePath}.restoring`;
  rmSync(staging, { recursive: true, force: true });
  try {
    for (const [rel, bytes] of takeEntries) {
      const target = path.join(staging, ...rel.split("/"));
      mkdirSync(path.dirname(target), { recursive: true });
      writeFileSync(target, bytes);
    }
    mkdirSync(staging, { recursive: true });
    mkdirSync(path.dirname(databasePath), { recursive: true });
    writeFileSync(stagedDb, db);
  } catch (e) {
    rmSync(staging, { recursive: true, force: true });
    rmSync(stagedDb, { force: true });
    throw e;
  }
  for (const suffix of ["-wal", "-shm"]) rmSync(databasePath + suffix, { force: true });
  renameSync(stagedDb, databasePath);
  const old = `${takesDir}.replaced`;
  rmSync(old, { recursive: true, force: true });
  if (existsSync(takesDir)) renameSync(takesDir, old);
  renameSync(staging, takesDir);
  rmSync(old, { recursive: true, force: true });
  return { takeFiles: takeEntries.length };
}
