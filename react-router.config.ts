import type { Config } from "@react-router/dev/config";

export default {
  ssr: true,
  // Several builds can live side by side (e.g. parallel end-to-end runs): NEARNOTE_BUILD_DIR picks the folder.
  buildDirectory: process.env.NEARNOTE_BUILD_DIR ?? "build",
  future: {
    v8_middleware: true,
    v8_splitRouteModules: true,
    v8_viteEnvironmentApi: true,
    v8_passThroughRequests: true,
    v8_trailingSlashAwareDataRequests: true,
  },
} satisfies Config;
