import { randomBytes } from "node:crypto";
import { chmodSync, existsSync, mkdirSync, readFileSync, statSync, writeFileSync } from "node:fs";
import path from "node:path";
import { z } from "zod";

const schema = z.object({
  STORAGE_DIR: z.string().min(1).default("storage"),
  DATABASE_PATH: z.string().min(1).optional(),
  SESSION_SECRET: z
    .string()
    .min(32, "SESSION_SECRET must be at least 32 characters (e.g. `openssl rand -hex 32`)")
    .optional(),
  APP_URL: z
    .url({ protocol: /^https?$/, error: "APP_URL must be an http:// or https:// URL" })
    .default("http://127.0.0.1:3000"),
  SMTP_URL: z
    .string()
    .regex(/^smtps?:\/\//, "SMTP_URL must start with smtp:// or smtps://")
    .optional(),
  HOST: z.string().min(1).default("127.0.0.1"),
  PORT: z.coerce.number().int().min(1).max(65535).default(3000),
  // Longest a worker may spend on one take before it is kept as "too complex to grade".
  ANALYSIS_TIME_LIMIT_MS: z.coerce
    .number({ error: "ANALYSIS_TIME_LIMIT_MS must be a number of milliseconds" })
    .int()
    .min(100, "ANALYSIS_TIME_LIMIT_MS must be at least 100")
    .max(600_000, "ANALYSIS_TIME_LIMIT_MS must be at most 600000 (ten minutes)")
    .default(15_000),
  // A missing storage folder is created only when asked: an unmounted volume must not look like an empty studio.
  STORAGE_CREATE: z.enum(["0", "1"], { error: "STORAGE_CREATE must be 0 or 1" }).optional(),
  // Only behind a reverse proxy that sets X-Forwarded-For: sign-in throttling then keys on the address it names.
  TRUST_PROXY: z.enum(["0", "1"], { error: "TRUST_PROXY must be 0 or 1" }).optional(),
  // One line per request on standard output (morgan's "tiny" format) unless "off".
  NEARNOTE_ACCESS_LOG: z.enum(["on", "off"], { error: "NEARNOTE_ACCESS_LOG must be on or off" }).optional(),
  // The start-up sweep of orphan take files, re-analysis of outdated takes and the daily mail scheduler, unless "off".
  NEARNOTE_BACKGROUND: z.enum(["on", "off"], { error: "NEARNOTE_BACKGROUND must be on or off" }).optional(),
  MIGRATIONS_DIR: z.string().min(1).default("drizzle"),
  // The folder of the local mail catcher (the demo and the tests): /dev/mail lists it; unset, /dev/mail is a 404.
  MAIL_CATCHER_DIR: z.string().min(1).optional(),
});

export type Env = {
  storageDir: string;
  databasePath: string;
  sessionSecret: string;
  appUrl: string;
  secureCookies: boolean;
  smtpUrl: string | undefined;
  host: string;
  port: number;
  analysisTimeLimitMs: number;
  createStorage: boolean;
  trustProxy: boolean;
  accessLog: boolean;
  background: boolean;
  migrationsDir: string;
  mailCatcherDir: string | undefined;
};

export class ConfigError extends Error {}

/** Parses the environment; throws ConfigError naming every bad variable. */
export function parseEnv(source: NodeJS.ProcessEnv): Omit<Env, "sessionSecret"> & {
  sessionSecret: string | undefined;
} {
  const result = schema.safeParse(source);
  if (!result.success) {
    const lines = result.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`);
    throw new ConfigError(`Nearnote cannot start, the environment is malformed:\n${lines.join("\n")}`);
  }
  const e = result.data;
  const storageDir = path.resolve(e.STORAGE_DIR);
  return {
    storageDir,
    databasePath: path.resolve(e.DATABASE_PATH ?? path.join(storageDir, "nearnote.db")),
    sessionSecret: e.SESSION_SECRET,
    appUrl: e.APP_URL.replace(/\/$/, ""),
    secureCookies: e.APP_URL.startsWith("https:"),
    smtpUrl: e.SMTP_URL,
    host: e.HOST,
    port: e.PORT,
    analysisTimeLimitMs: e.ANALYSIS_TIME_LIMIT_MS,
    createStorage: e.STORAGE_CREATE === "1",
    trustProxy: e.TRUST_PROXY === "1",
    accessLog: e.NEARNOTE_ACCESS_LOG !== "off",
    background: e.NEARNOTE_BACKGROUND !== "off",
    migrationsDir: path.resolve(e.MIGRATIONS_DIR),
    mailCatcherDir: e.MAIL_CATCHER_DIR ? path.resolve(e.MAIL_CATCHER_DIR) : undefined,
  };
}

/** When no secret is configured, generate one once and keep it (owner-only) in storage/. */
export function loadOrCreateSecret(storageDir: string, log = console.warn): string {
  const file = path.join(storageDir, "session-secret");
  if (existsSync(file)) return readFileSync(file, "utf8").trim();
  mkdirSync(storageDir, { recursive: true });
  const secret = randomBytes(32).toString("hex");
  writeFileSync(file, secret + "\n", { mode: 0o600 });
  chmodSync(file, 0o600);
  log(`[nearnote] SESSION_SECRET is not set: generated one and stored it in ${file}`);
  return secret;
}

/**
 * Refuses a storage folder that is not there, unless creating it was asked for
 * (the demo, or a first start with STORAGE_CREATE=1 / `npm start -- --create-storage`).
 */
export function ensureStorageDir(storageDir: string, create: boolean, log = console.warn) {
  if (existsSync(storageDir)) {
    if (!statSync(storageDir).isDirectory())
      throw new ConfigError(`Nearnote cannot start: STORAGE_DIR ${storageDir} is not a folder.`);
    return;
  }
  if (!create) {
    throw new ConfigError(
      `Nearnote cannot start: the storage folder ${storageDir} does not exist. ` +
        "If the storage volume is not mounted, mount it; on a first start, set STORAGE_CREATE=1 (or run `npm start -- --create-storage`) to create it.",
    );
  }
  mkdirSync(storageDir, { recursive: true });
  log(`[nearnote] created the storage folder ${storageDir}`);
}

let cached: Env | undefined;

export function env(): Env {
  if (!cached) {
    const parsed = parseEnv(process.env);
    ensureStorageDir(parsed.storageDir, parsed.createStorage);
    cached = {
      ...parsed,
      sessionSecret: parsed.sessionSecret ?? loadOrCreateSecret(parsed.storageDir),
    };
  }
  return cached;
}

/** Tests point the app at a fresh storage folder (or change another setting) and need the cache dropped. */
export function resetEnvForTests() {
  cached = undefined;
}
