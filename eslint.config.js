import js from "@eslint/js";
import tseslint from "typescript-eslint";

export default tseslint.config(
  {
    ignores: [
      "dist/",
      "node_modules/",
      "runs/",
      "coverage/",
      "test/fixtures/",
      "**/*.generated.ts",
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    rules: {
      "@typescript-eslint/no-explicit-any": "error",
      "@typescript-eslint/no-unused-vars": [
        "error",
        { argsIgnorePattern: "^_", varsIgnorePattern: "^_" },
      ],
      "no-constant-condition": ["error", { checkLoops: false }],
    },
  },
  {
    // The scorer runs in browsers with a strict content policy and embeds in any service.
    files: ["scorer/**/*.ts"],
    rules: {
      "no-eval": "error",
      "no-new-func": "error",
      "no-restricted-imports": ["error", { patterns: ["node:*", "../*/**", "!./*"] }],
    },
  },
);
