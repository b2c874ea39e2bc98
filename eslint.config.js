// Lint: typescript-eslint's recommended rules plus the layer boundaries of DEVELOPERS.md
// ("dependencies point inward"): core imports nothing outward; sheets imports no adapter or UI.
import js from "@eslint/js";
import tseslint from "typescript-eslint";
import importX from "eslint-plugin-import-x";
import globals from "globals";
import { createTypeScriptImportResolver } from "eslint-import-resolver-typescript";

/** Folders a layer may not import from, by layer (paths from the project root). */
export const LAYER_RULES = [
  {
    target: "./src/core",
    from: ["./src/sheets", "./src/settings", "./src/workbook", "./src/geocode", "./src/exports", "./src/taskpane", "./src/cli"],
  },
  { target: "./src/sheets", from: ["./src/workbook", "./src/geocode", "./src/exports", "./src/taskpane", "./src/cli"] },
  { target: "./src/settings", from: ["./src/workbook", "./src/geocode", "./src/exports", "./src/taskpane", "./src/cli"] },
  { target: "./src/exports", from: ["./src/workbook", "./src/geocode", "./src/taskpane", "./src/cli"] },
  { target: "./src/geocode", from: ["./src/workbook", "./src/exports", "./src/taskpane", "./src/cli"] },
  { target: "./src/workbook", from: ["./src/taskpane", "./src/cli"] },
];

export default tseslint.config(
  { ignores: ["node_modules/", "dist/", "coverage/", "test-artifacts/", "bench/out/", "**/*.cjs"] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    plugins: { "import-x": importX },
    settings: { "import-x/resolver-next": [createTypeScriptImportResolver({ project: "./tsconfig.json" })] },
    rules: {
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_" }],
      "import-x/no-restricted-paths": [
        "error",
        {
          zones: [
            ...LAYER_RULES.flatMap((r) =>
              r.from.map((from) => ({
                target: r.target,
                from,
                message: `${r.target.slice(6)} must not import ${from.slice(6)} (layers point inward; see DEVELOPERS.md).`,
              })),
            ),
            {
              // The other layers see the core only through its public entry.
              target: "./src/!(core)/**/*",
              from: "./src/core",
              except: ["./index.ts"],
              message: "Import the core through src/core/index.ts, its single public entry (see DEVELOPERS.md).",
            },
          ],
        },
      ],
    },
  },
  {
    // The pure core: no Node built-ins, no DOM, no clock, no Math.random.
    files: ["src/core/**/*.ts"],
    languageOptions: { globals: {} },
    rules: {
      "no-restricted-imports": ["error", { patterns: [{ group: ["node:*"], message: "src/core is pure: no Node built-ins." }] }],
      "no-restricted-properties": [
        "error",
        { object: "Math", property: "random", message: "src/core draws every random number from the seeded generator." },
        { object: "Date", property: "now", message: "src/core takes time through options.now." },
      ],
    },
  },
);
