import { readdir, readFile } from "node:fs/promises";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";
import { build } from "esbuild";
import { describe, expect, it } from "vitest";

const root = join(dirname(fileURLToPath(import.meta.url)), "../..");
const scorerDir = join(root, "scorer");

/** Every scorer source file, comments removed (doc examples may show imports and the words eval or Function). */
async function scorerSources(): Promise<[string, string][]> {
  const names = (await readdir(scorerDir)).filter((name) => name.endsWith(".ts"));
  return Promise.all(
    names.map(async (name) => {
      const text = await readFile(join(scorerDir, name), "utf8");
      return [name, text.replace(/\/\*[\s\S]*?\*\/|(^|[^:"'`])\/\/[^\n]*/g, "$1")] as [
        string,
        string,
      ];
    }),
  );
}

describe("the scorer package stays self-contained", () => {
  it("imports nothing outside scorer/ and no Node built-ins", async () => {
    const sources = await scorerSources();
    expect(sources.length).toBeGreaterThan(20);
    for (const [name, text] of sources) {
      const specifiers = [
        ...text.matchAll(
          /\b(?:import|export)\b[^;'"]*?\bfrom\s*["']([^"']+)["']|\bimport\s*\(\s*["']([^"']+)["']|\bimport\s+["']([^"']+)["']|\brequire\s*\(/g,
        ),
      ].map((match) => match[1] ?? match[2] ?? match[3] ?? "require(");
      for (const specifier of specifiers) {
        expect(specifier, `${name} imports ${specifier}`).toMatch(/^\.\/[a-z0-9.-]+\.js$/);
      }
    }
  });

  it("never evaluates text as code", async () => {
    for (const [name, code] of await scorerSources()) {
      expect(code, name).not.toMatch(
        /\beval\s*\(|\bnew\s+Function\b|\bFunction\s*\(|\bsetTimeout\s*\(\s*["'`]|\bimport\s*\(/,
      );
    }
  });

  it("bundles for browsers into one file of bounded size", async () => {
    const result = await build({
      entryPoints: [join(scorerDir, "index.ts")],
      bundle: true,
      minify: true,
      format: "esm",
      platform: "browser",
      write: false,
      logLevel: "silent",
    });
    const bytes = result.outputFiles[0].contents.length;
    console.log(`scorer bundle (esbuild, minified ESM): ${bytes} bytes`);
    expect(result.errors).toEqual([]);
    // Most of it is the artifact schema document the runtime validates against.
    expect(bytes).toBeLessThan(80_000);
    expect(result.outputFiles[0].text).not.toMatch(/\bnew Function\b|\beval\(/);
  });
});
