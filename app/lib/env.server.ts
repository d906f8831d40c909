import { randomBytes } from "node:crypto";
import { chmodSync, existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { z } from "zod";

const schema = z.object({
  STORAGE_DIR: z.string().min(1).default("storage"),
  DATABASE_PATH: z.string().min(1).optional(),
  SESSION_SECRET: z
    .string()
    .min(32, "SESSION_SECRET must be at least 32 characters (e.g. `openssl rand -hex 32`)")
    .optional(),
  APP_URL: z.url({ protocol: /^https?$/, error: "APP_URL must be an http:// or https:// URL" }).default(
    "http://127.0.0.1:3000",
  ),
  SMTP_URL: z
    .string()
    .regex(/^smtps?:\/\//, "SMTP_URL must start with smtp:// or smtps://")
    .optional(),
  HOST: z.string().min(1).default("127.0.0.1"),
  PORT: z.coerce.number().int().min(1).max(65535).default(3000),
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

let cached: Env | undefined;

export function env(): Env {
  if (!cached) {
    const parsed = parseEnv(process.env);
    cached = {
      ...parsed,
      sessionSecret: parsed.sessionSecret ?? loadOrCreateSecret(parsed.storageDir),
    };
  }
  return cached;
}

/** Tests point the app at a fresh storage folder and need the cache dropped. */
export function resetEnvForTests() {
  cached = undefined;
}
