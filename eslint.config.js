// The house rules, kept by the tooling: `npm run lint` (part of `npm test`) fails on any report.
// The import boundaries below are the architecture of DEVELOPERS.md; fix the code, never the rule.
import { readdirSync } from "node:fs";
import js from "@eslint/js";
import { createTypeScriptImportResolver } from "eslint-import-resolver-typescript";
import { importX } from "eslint-plugin-import-x";
import jsxA11y from "eslint-plugin-jsx-a11y";
import reactHooks from "eslint-plugin-react-hooks";
import globals from "globals";
import tseslint from "typescript-eslint";

const dirs = (path) =>
  readdirSync(new URL(path, import.meta.url), { withFileTypes: true })
    .filter((entry) => entry.isDirectory())
    .map((entry) => entry.name);

const features = dirs("./src/features/");
const serverModules = dirs("./server/modules/");

/** Client: pages compose features; a feature imports no other feature; shared code imports no feature. */
const clientZones = [
  ...features.map((feature) => ({
    target: `./src/features/${feature}`,
    from: "./src/features",
    except: [`./${feature}`],
    message:
      "A feature imports no other feature: compose them in a page under src/app, or move the shared piece to src/components or src/lib.",
  })),
  {
    target: ["./src/components", "./src/lib"],
    from: ["./src/features", "./src/app"],
    message: "Shared client code (src/components, src/lib) imports no feature and no page.",
  },
  {
    target: "./src/lib/domain",
    from: ["./src/app", "./src/features", "./src/components", "./server"],
    message: "The pure domain imports only the domain.",
  },
  {
    target: ["./src/lib/schemas", "./src/lib/contracts"],
    from: ["./src/app", "./src/features", "./src/components", "./server"],
    message: "Shared schemas and contracts import no client or server code.",
  },
  {
    target: "./src",
    from: "./server",
    message: "The client imports nothing from the server.",
  },
];

/** Server: no UI code; a module reaches another module's records only through that module's service. */
const serverZones = [
  {
    target: "./server",
    from: ["./src/app", "./src/features", "./src/components"],
    message: "Server code imports nothing from the client's pages, features or components.",
  },
  ...serverModules.map((module) => ({
    target: `./server/modules/${module}/**/!(*.entity).ts`,
    from: [`./server/modules/!(${module})/**/*.entity.ts`, `./server/modules/!(${module})/**/*.repository.ts`],
    message: "A module calls another module's service, never its entity or repository.",
  })),
];

/** The domain is pure: no framework and no I/O. */
const frameworkAndIo = [
  "react",
  "react-*",
  "@tanstack/*",
  "express",
  "express-*",
  "typeorm",
  "mysql2",
  "mysql2/*",
  "nodemailer",
  "sharp",
  "multer",
  "fs",
  "fs/*",
  "node:*",
  "http",
  "https",
  "net",
  "child_process",
];

export default tseslint.config(
  // Migrations are generated and never edited once landed.
  { ignores: ["dist/", "dist-server/", "node_modules/", "coverage/", ".data/", "uploads/", "server/db/migrations/"] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  importX.flatConfigs.recommended,
  importX.flatConfigs.typescript,
  {
    linterOptions: { reportUnusedDisableDirectives: "error" },
    languageOptions: { ecmaVersion: 2023, sourceType: "module", globals: { ...globals.node } },
    settings: {
      "import-x/resolver-next": [
        createTypeScriptImportResolver({
          project: ["src/tsconfig.json", "server/tsconfig.json", "tests/tsconfig.json"],
          noWarnOnMultipleProjects: true,
        }),
      ],
    },
    rules: {
      "import-x/no-cycle": ["error", { ignoreExternal: true }],
      // TypeScript checks default and namespace imports itself, with esModuleInterop (typescript-eslint's advice).
      "import-x/default": "off",
      "import-x/namespace": "off",
      "import-x/no-named-as-default-member": "off",
      "@typescript-eslint/no-unused-vars": [
        "error",
        { argsIgnorePattern: "^_", varsIgnorePattern: "^_", caughtErrorsIgnorePattern: "^_" },
      ],
      "@typescript-eslint/consistent-type-imports": ["error", { fixStyle: "inline-type-imports" }],
    },
  },
  {
    files: ["src/**/*.{ts,tsx}", "tests/client/**/*.{ts,tsx}"],
    ...reactHooks.configs.flat["recommended-latest"],
    languageOptions: { globals: { ...globals.browser } },
  },
  { files: ["src/**/*.tsx"], ...jsxA11y.flatConfigs.recommended },
  {
    files: ["src/**/*.tsx"],
    rules: {
      // A scrolling region must be reachable by keyboard (axe: scrollable-region-focusable), so a
      // labelled region may take tabIndex={0} as a tab panel may.
      "jsx-a11y/no-noninteractive-tabindex": ["error", { tags: [], roles: ["tabpanel", "region"], allowExpressionValues: true }],
    },
  },
  {
    files: ["src/**/*.{ts,tsx}"],
    rules: { "import-x/no-restricted-paths": ["error", { zones: clientZones }] },
  },
  {
    files: ["src/lib/domain/**/*.ts"],
    rules: {
      "no-restricted-imports": [
        "error",
        { patterns: [{ group: frameworkAndIo, message: "The domain is pure: no framework and no I/O." }] },
      ],
    },
  },
  {
    files: ["server/**/*.ts"],
    rules: { "import-x/no-restricted-paths": ["error", { zones: serverZones }] },
  },
);
