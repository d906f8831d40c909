import { mkdtempSync, readFileSync, statSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { describe, expect, it, vi } from "vitest";
import { ConfigError, loadOrCreateSecret, parseEnv } from "~/server/env.server";

describe("configuration", () => {
  it("has local defaults under storage/", () => {
    const e = parseEnv({});
    expect(e.storageDir).toBe(path.resolve("storage"));
    expect(e.databasePath).toBe(path.resolve("storage/nearnote.db"));
    expect(e.host).toBe("127.0.0.1");
    expect(e.port).toBe(3000);
    expect(e.secureCookies).toBe(false);
    expect(e.sessionSecret).toBeUndefined();
  });

  it("makes cookies Secure exactly when APP_URL is https", () => {
    expect(parseEnv({ APP_URL: "https://keys.example" }).secureCookies).toBe(true);
    expect(parseEnv({ APP_URL: "http://keys.example" }).secureCookies).toBe(false);
  });

  it("stops with a clear message naming each malformed value", () => {
    expect(() => parseEnv({ PORT: "eighty", APP_URL: "ftp://x", SESSION_SECRET: "short" })).toThrow(ConfigError);
    const error = (() => {
      try {
        parseEnv({ PORT: "eighty", SESSION_SECRET: "short", SMTP_URL: "mail.example" });
      } catch (e) {
        return e as Error;
      }
    })();
    expect(error?.message).toMatch(/PORT/);
    expect(error?.message).toMatch(/SESSION_SECRET must be at least 32/);
    expect(error?.message).toMatch(/SMTP_URL must start with smtp/);
  });

  it("takes the analysis time limit and the storage-creation switch, refusing malformed ones", () => {
    expect(parseEnv({}).analysisTimeLimitMs).toBe(15_000);
    expect(parseEnv({}).createStorage).toBe(false);
    expect(parseEnv({ ANALYSIS_TIME_LIMIT_MS: "2500", STORAGE_CREATE: "1" })).toMatchObject({
      analysisTimeLimitMs: 2500,
      createStorage: true,
    });
    expect(() => parseEnv({ ANALYSIS_TIME_LIMIT_MS: "soon" })).toThrow(/ANALYSIS_TIME_LIMIT_MS/);
    expect(() => parseEnv({ ANALYSIS_TIME_LIMIT_MS: "5" })).toThrow(/at least 100/);
    expect(() => parseEnv({ STORAGE_CREATE: "yes" })).toThrow(/STORAGE_CREATE must be 0 or 1/);
  });

  it("takes the server's switches and folders through the same checks", () => {
    expect(parseEnv({})).toMatchObject({
      trustProxy: false,
      accessLog: true,
      background: true,
      migrationsDir: path.resolve("drizzle"),
      mailCatcherDir: undefined,
    });
    expect(
      parseEnv({
        TRUST_PROXY: "1",
        NEARNOTE_ACCESS_LOG: "off",
        NEARNOTE_BACKGROUND: "off",
        MIGRATIONS_DIR: "db/migrations",
        MAIL_CATCHER_DIR: "storage/mail",
      }),
    ).toMatchObject({
      trustProxy: true,
      accessLog: false,
      background: false,
      migrationsDir: path.resolve("db/migrations"),
      mailCatcherDir: path.resolve("storage/mail"),
    });
    expect(() => parseEnv({ TRUST_PROXY: "yes" })).toThrow(/TRUST_PROXY must be 0 or 1/);
    expect(() => parseEnv({ NEARNOTE_ACCESS_LOG: "0" })).toThrow(/NEARNOTE_ACCESS_LOG must be on or off/);
    expect(() => parseEnv({ NEARNOTE_BACKGROUND: "no" })).toThrow(/NEARNOTE_BACKGROUND must be on or off/);
  });

  it("generates a secret once, keeps it owner-only and says so", () => {
    const dir = mkdtempSync(path.join(tmpdir(), "nearnote-env-"));
    const log = vi.fn();
    const first = loadOrCreateSecret(dir, log);
    expect(first).toMatch(/^[0-9a-f]{64}$/);
    expect(log).toHaveBeenCalledOnce();
    expect(statSync(path.join(dir, "session-secret")).mode & 0o777).toBe(0o600);
    expect(loadOrCreateSecret(dir, log)).toBe(first);
    expect(log).toHaveBeenCalledOnce();
    expect(readFileSync(path.join(dir, "session-secret"), "utf8").trim()).toBe(first);
  });
});
