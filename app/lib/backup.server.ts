import { Zip, ZipPassThrough, unzipSync } from "fflate";
import { createReadStream, createWriteStream, existsSync, mkdirSync, readdirSync, renameSync, rmSync, writeFileSync } from "node:fs";
import { mkdtemp } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import type Database from "better-sqlite3";

// A backup is one ZIP file: `nearnote.db` (SQLite's online backup, consistent even
// while the app writes) and `takes/…` (the stored take files, copied afterwards).

function listFiles(dir: string, base = dir): string[] {
  if (!existsSync(dir)) return [];
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    return e.isDirectory() ? listFiles(p, base) : [path.relative(base, p)];
  });
}

async function addFile(zip: Zip, name: string, file: string) {
  const entry = new ZipPassThrough(name);
  zip.add(entry);
  for await (const chunk of createReadStream(file)) entry.push(new Uint8Array(chunk as Buffer));
  entry.push(new Uint8Array(0), true);
}

export async function writeBackup(sqlite: Database.Database, storageDir: string, destination: string) {
  const work = await mkdtemp(path.join(tmpdir(), "nearnote-backup-"));
  try {
    const dbCopy = path.join(work, "nearnote.db");
    await sqlite.backup(dbCopy);
    const takesDir = path.join(storageDir, "takes");
    const takeFiles = listFiles(takesDir);
    mkdirSync(path.dirname(destination), { recursive: true });
    const partial = `${destination}.partial`;
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
    await addFile(zip, "nearnote.db", dbCopy);
    for (const f of takeFiles) await addFile(zip, `takes/${f.split(path.sep).join("/")}`, path.join(takesDir, f));
    zip.end();
    await done;
    renameSync(partial, destination); // only a complete archive carries the final name
    return { destination, takeFiles: takeFiles.length };
  } finally {
    rmSync(work, { recursive: true, force: true });
  }
}

/** Puts a backup back: the database file (WAL files removed) and the take files. Stop the app first. */
export function restoreBackup(archive: Uint8Array, databasePath: string, storageDir: string) {
  const entries = unzipSync(archive);
  const db = entries["nearnote.db"];
  if (!db) throw new Error("This file is not a Nearnote backup (no nearnote.db inside).");
  for (const suffix of ["", "-wal", "-shm"]) rmSync(databasePath + suffix, { force: true });
  mkdirSync(path.dirname(databasePath), { recursive: true });
  writeFileSync(databasePath, db);
  const takesDir = path.join(storageDir, "takes");
  rmSync(takesDir, { recursive: true, force: true });
  let files = 0;
  for (const [name, bytes] of Object.entries(entries)) {
    if (!name.startsWith("takes/") || name.endsWith("/")) continue;
    const target = path.resolve(takesDir, name.slice("takes/".length));
    if (!target.startsWith(takesDir + path.sep)) throw new Error(`Refusing an entry outside the takes folder: ${name}`);
    mkdirSync(path.dirname(target), { recursive: true });
    writeFileSync(target, bytes);
    files++;
  }
  return { takeFiles: files };
}
