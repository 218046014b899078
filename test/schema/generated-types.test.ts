// The JSON Schema files are the single source of truth: the generated TypeScript
// modules must match what `npm run schemas` renders from them now.
import { existsSync, readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { generatedModules, renderModule } from "../../schemas/generate.js";

describe("generated schema modules", () => {
  for (const module of generatedModules.filter((m) => existsSync(m.schemaFile))) {
    it(`${module.outputFile} is up to date with ${module.schemaFile}`, async () => {
      const expected = await renderModule(module);
      expect(readFileSync(module.outputFile, "utf8")).toBe(expected);
    });
  }
});
