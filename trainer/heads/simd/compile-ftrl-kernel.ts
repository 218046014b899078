import wabtInit from "wabt";
import { ftrlKernelWat } from "./ftrl-kernel-wat.js";

/**
 * Compiles the FTRL kernel's WebAssembly text with wabt (dev dependency only:
 * used to regenerate the committed bytes and by the test that checks them).
 *
 * @example
 * const bytes = await compileFtrlKernel(); // Uint8Array, a valid module
 */
export async function compileFtrlKernel(): Promise<Uint8Array> {
  const wabt = await wabtInit();
  const parsed = wabt.parseWat("ftrl-kernel.wat", ftrlKernelWat(), { simd: true, threads: true });
  try {
    return new Uint8Array(parsed.toBinary({ canonicalize_lebs: true }).buffer);
  } finally {
    parsed.destroy();
  }
}
