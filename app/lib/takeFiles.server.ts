import { LocalFileStorage } from "@mjackson/file-storage/local";
import { randomUUID } from "node:crypto";
import path from "node:path";
import { env } from "~/lib/env.server";

// Take files live under storage/takes/ by a random key: the client's file name
// is kept in the database only, never used in a path.
const stores = new Map<string, LocalFileStorage>();

export function takeStorage(): LocalFileStorage {
  const dir = path.join(env().storageDir, "takes");
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
  await takeStorage().remove(fileKey);
}
