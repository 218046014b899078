import { describe, expect, it } from "vitest";
import { compileTreeKernel } from "../../trainer/trees/simd/compile-tree-kernel.js";
import { TREE_KERNEL_BASE64 } from "../../trainer/trees/simd/tree-kernel.generated.js";
import {
  MAX_HISTOGRAM_COLUMNS,
  MAX_PARTITION_WORDS,
} from "../../trainer/trees/simd/tree-kernel-wat.js";

// The committed kernel bytes are what wabt (the WebAssembly project's own text
// compiler, an independent tool) makes of the generated text today; stale bytes
// mean someone changed tree-kernel-wat.ts without regenerating them
// (npm run wasm).
describe("the committed tree kernel", () => {
  it("matches its WebAssembly text, compiled again", async () => {
    const committed = Buffer.from(TREE_KERNEL_BASE64, "base64");
    expect(Buffer.from(await compileTreeKernel()).equals(committed)).toBe(true);
  });

  it("is a module this engine accepts, with every histogram and partition width", () => {
    const bytes = Buffer.from(TREE_KERNEL_BASE64, "base64");
    expect(WebAssembly.validate(bytes)).toBe(true);
    const exports = WebAssembly.Module.exports(new WebAssembly.Module(bytes)).map((e) => e.name);
    for (let k = 1; k <= MAX_HISTOGRAM_COLUMNS; k++) expect(exports).toContain(`hist${k}`);
    for (let w = 1; w <= MAX_PARTITION_WORDS; w++) expect(exports).toContain(`part${w}`);
  });
});
