import { existsSync } from "node:fs";
import type http from "node:http";
import type { AddressInfo } from "node:net";
import path from "node:path";
import { afterEach, beforeEach } from "vitest";
import { resetEnvForTests } from "~/server/env.server";
import { createApp } from "../../scripts/lib/server";

/**
 * Serves the built app (Express + React Router, as in production) on a free
 * loopback port for each test. Use after `useFreshApp()`.
 */
export function useHttpApp() {
  const state = { base: "", server: undefined as http.Server | undefined };
  const build = path.resolve(process.env.NEARNOTE_BUILD_DIR ?? "build");
  beforeEach(async () => {
    if (!existsSync(path.join(build, "server/index.js")))
      throw new Error(`Build the app first (npm run build): ${build}`);
    process.env.NEARNOTE_ACCESS_LOG = "off";
    process.env.NEARNOTE_BACKGROUND = "off";
    resetEnvForTests(); // the settings above are read through the checked configuration
    const app = await createApp(build);
    state.server = await new Promise((resolve) => {
      const s = app.listen(0, "127.0.0.1", () => resolve(s));
    });
    state.base = `http://127.0.0.1:${(state.server!.address() as AddressInfo).port}`;
  });
  afterEach(async () => {
    await new Promise((r) => state.server?.close(r));
  });
  return {
    get base() {
      return state.base;
    },
    /** Signs in through the real /login form and returns the Cookie header to send. */
    async signIn(email: string, password: string) {
      const res = await fetch(`${state.base}/login`, {
        method: "POST",
        body: new URLSearchParams({ email, password }),
        headers: { Origin: state.base },
        redirect: "manual",
      });
      if (res.status !== 302) throw new Error(`sign-in of ${email} answered ${res.status}`);
      return res.headers
        .getSetCookie()
        .map((c) => c.split(";")[0])
        .join("; ");
    },
  };
}
