import { isNotNull } from "drizzle-orm";
import { db } from "~/db/client.server";
import { exercises, takes } from "~/db/schema";
import { listStoredTakeFiles, removeStoredFile, takeFileNames } from "~/takes/takeFiles.server";

/** Hashes of every file key a row refers to: takes and exercises' model takes. */
function referencedHashes(): Set<string> {
  const keys = [
    ...db()
      .select({ k: takes.fileKey })
      .from(takes)
      .all()
      .map((r) => r.k),
    ...db()
      .select({ k: exercises.modelFileKey })
      .from(exercises)
      .where(isNotNull(exercises.modelFileKey))
      .all()
      .map((r) => r.k!),
  ];
  return new Set(keys.map((k) => takeFileNames(k).hash));
}

/**
 * Removes stored take files that no row refers to (left by a crash mid-upload or
 * mid-analysis, racing uploads, or a deletion that could not remove its file).
 * Only files last written before `olderThan` go: an upload in progress has its
 * file before its row. Returns how many take files (data with its metadata) were removed.
 */
export async function sweepOrphanTakeFiles(olderThan: Date): Promise<number> {
  const files = await listStoredTakeFiles();
  const cutoff = olderThan.getTime();
  const candidates = files.filter((f) => f.mtimeMs < cutoff);
  if (candidates.length === 0) return 0;
  // Read the rows after listing the files, so a row written meanwhile still protects its file.
  const referenced = referencedHashes();
  const removed = new Set<string>();
  for (const f of candidates) {
    if (referenced.has(f.hash)) continue;
    await removeStoredFile(f.file);
    removed.add(f.hash);
  }
  return removed.size;
}

/** How long a file without a row is given to get one before a sweep outside start-up removes it. */
export const ORPHAN_GRACE_MS = 60 * 60 * 1000;
