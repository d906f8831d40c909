import type { Config } from "@react-router/dev/config";

// A bare "hello" app served by react-router-serve: the ceiling `npm run load` compares against.
export default { ssr: true, buildDirectory: "../../../build-hello" } satisfies Config;
