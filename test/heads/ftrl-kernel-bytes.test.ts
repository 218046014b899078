import { describe, expect, it } from "vitest";
import { compileFtrlKernel } from "../../trainer/heads/simd/compile-ftrl-kernel.js";
import { FTRL_KERNEL_BASE64 } from "../../trainer/heads/simd/ftrl-kernel.generated.js";
import { MAX_KERNEL_PAIRS } from "../../trainer/heads/simd/ftrl-kernel-wat.js";

// The committed kernel bytes are what wabt (the WebAssembly project's own text
// compiler, an independent tool) makes of the generated text today; stale bytes
// mean someone changed ftrl-kernel-wat.ts without `npm run wasm`.
describe("the committed FTRL kernel", () => {
  it("matches its WebAssembly text, compiled again", async () => {
    const committed = Buffer.from(FTRL_KERNEL_BASE64, "base64");
    expect(Buffer.from(await compileFtrlKernel()).equals(committed)).toBe(true);
  });

  it("is a module this engine accepts, with a score and an update per width", () => {
    const bytes = Buffer.from(FTRL_KERNEL_BASE64, "base64");
    expect(WebAssembly.validate(bytes)).toBe(true);
    const exports = WebAssembly.Module.exports(new WebAssembly.Module(bytes)).map((e) => e.name);
    for (let p = 1; p <= MAX_KERNEL_PAIRS; p++) {
      expect(exports).toContain(`score${p}`);
      expect(exports).toContain(`update${p}`);
    }
  });
});
