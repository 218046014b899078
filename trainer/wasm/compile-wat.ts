import wabtInit from "wabt";

/**
 * Compiles WebAssembly text with wabt, the WebAssembly project's own toolkit
 * (a dev dependency: used to regenerate the committed kernel bytes and by the
 * tests that check them, never at run time). SIMD, threads (shared memory) and
 * bulk memory are enabled.
 *
 * @example
 * const bytes = await compileWat("ftrl-kernel.wat", ftrlKernelWat());
 */
export async function compileWat(name: string, text: string): Promise<Uint8Array> {
  const wabt = await wabtInit();
  const parsed = wabt.parseWat(name, text, { simd: true, threads: true, bulk_memory: true });
  try {
    return new Uint8Array(parsed.toBinary({ canonicalize_lebs: true }).buffer);
  } finally {
    parsed.destroy();
  }
}
