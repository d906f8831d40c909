// ESLint: the usual recommended sets for TypeScript and React hooks, Prettier
// for layout (eslint-config-prettier turns off what it decides), and the one
// direction the layers may point (DEVELOPERS.md, "Where each kind of code goes"):
//   routes → components → models / auth / forms / mail / takes / server → db;
//   browser and utils below the views, the engine (analysis) below everything.
import js from "@eslint/js";
import prettier from "eslint-config-prettier";
import reactHooks from "eslint-plugin-react-hooks";
import globals from "globals";
import tseslint from "typescript-eslint";

/** Import paths (alias and relative) that reach into a folder of `app/`. */
const into = (...folders) => folders.flatMap((f) => [`~/${f}`, `~/${f}/*`, `**/${f}/*`, `../${f}`]);

/** A layer may not import the layers above it (type-only imports of a lower layer are fine). */
function boundary(files, folders, message, allowTypeImports = false) {
  return {
    files,
    rules: {
      "@typescript-eslint/no-restricted-imports": [
        "error",
        { patterns: [{ group: into(...folders), message, allowTypeImports }] },
      ],
    },
  };
}

export default tseslint.config(
  {
    ignores: [
      "build/**",
      "node_modules/**",
      ".react-router/**",
      "storage/**",
      "test-results/**",
      "playwright-report/**",
      "reports/**",
      "public/**",
      "samples/**",
      "drizzle/**",
      ".stryker-tmp/**",
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ["**/*.{ts,tsx,js,mjs}"],
    languageOptions: { globals: { ...globals.browser, ...globals.node } },
    rules: {
      "@typescript-eslint/no-unused-vars": [
        "error",
        { argsIgnorePattern: "^_", varsIgnorePattern: "^_", caughtErrors: "none" },
      ],
      "@typescript-eslint/no-explicit-any": "error",
      "no-control-regex": "off",
    },
  },
  {
    // Hooks live in the app; tests and scripts have functions named use… that are not React hooks.
    files: ["app/**/*.{ts,tsx}"],
    plugins: { "react-hooks": reactHooks },
    rules: {
      ...reactHooks.configs.recommended.rules,
      // The React Compiler rules of the hooks plugin judge code written for it; Nearnote does not use it.
      "react-hooks/refs": "off",
      "react-hooks/set-state-in-effect": "off",
      "react-hooks/purity": "off",
      "react-hooks/immutability": "off",
      "react-hooks/preserve-manual-memoization": "off",
      "react-hooks/static-components": "off",
      "react-hooks/incompatible-library": "off",
    },
  },
  boundary(
    ["app/analysis/**"],
    ["components", "routes", "models", "db", "auth", "forms", "mail", "takes", "server", "browser", "utils"],
    "The engine stands alone: no app, database or React code.",
  ),
  boundary(
    ["app/utils/**"],
    ["components", "routes", "models", "db", "auth", "forms", "mail", "takes", "server", "browser"],
    "Pure helpers import only the engine and each other.",
  ),
  boundary(
    ["app/db/**"],
    ["components", "routes", "models", "auth", "forms", "mail", "takes"],
    "The database layer knows no models, auth or views.",
  ),
  boundary(
    ["app/browser/**"],
    ["components", "routes", "models", "db", "auth", "forms", "mail", "server"],
    "Browser code never reaches server code, views or routes.",
  ),
  boundary(
    ["app/models/**", "app/auth/**", "app/mail/**", "app/takes/**", "app/server/**", "app/forms/**"],
    ["components", "routes"],
    "Models and server helpers never import views or routes: types belong to the model.",
  ),
  // A component may name a route's action as a type (useFetcher<typeof action>), never import its code.
  boundary(
    ["app/components/**"],
    ["routes"],
    "Components take their data from the route, never import a route's code.",
    true,
  ),
  prettier,
);
