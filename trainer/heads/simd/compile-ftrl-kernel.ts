import { compileWat } from "../../wasm/compile-wat.js";
import { ftrlKernelWat } from "./ftrl-kernel-wat.js";

/**
 * Compiles the FTRL kernel's WebAssembly text (dev dependency wabt: for
 * `npm run wasm` and the test that checks the committed bytes).
 *
 * @example
 * const bytes = await compileFtrlKernel(); // Uint8Array, a valid module
 */
export function compileFtrlKernel(): Promise<Uint8Array> {
  return compileWat("ftrl-kernel.wat", ftrlKernelWat());
}
