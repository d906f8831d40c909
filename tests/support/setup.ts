import { existsSync, mkdtempSync, readdirSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterEach, beforeEach } from "vitest";
import { closeDatabase, db } from "~/db/client.server";
import { resetEnvForTests } from "~/server/env.server";
import { resetSessionCookieForTests } from "~/auth/session.server";

export type FreshApp = { storageDir: string };

/**
 * Points the app at a new storage folder and a freshly migrated SQLite file
 * before each test, and removes both afterwards.
 */
export function useFreshApp(): FreshApp {
  const state: FreshApp = { storageDir: "" };
  beforeEach(() => {
    state.storageDir = mkdtempSync(path.join(tmpdir(), "nearnote-test-"));
    process.env.STORAGE_DIR = state.storageDir;
    process.env.DATABASE_PATH = path.join(state.storageDir, "test.db");
    process.env.SESSION_SECRET = "test-secret-0123456789abcdef0123456789abcdef";
    process.env.APP_URL = "http://127.0.0.1:3000";
    closeDatabase();
    resetEnvForTests();
    resetSessionCookieForTests();
    db(); // migrate now, so a broken migration fails here
  });
  afterEach(() => {
    closeDatabase();
    rmSync(state.storageDir, { recursive: true, force: true });
  });
  return state;
}

/** Take files kept under storage/takes/ (LocalFileStorage writes one `.dat` per file beside its metadata). */
export function storedTakeFiles(storageDir: string): string[] {
  const dir = path.join(storageDir, "takes");
  if (!existsSync(dir)) return [];
  return readdirSync(dir, { recursive: true })
    .map(String)
    .filter((f) => f.endsWith(".dat"));
}
