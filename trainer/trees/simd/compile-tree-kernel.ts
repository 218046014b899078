import { compileWat } from "../../wasm/compile-wat.js";
import { treeKernelWat } from "./tree-kernel-wat.js";

/**
 * Compiles the tree kernel's WebAssembly text (dev dependency wabt: for
 * `npm run wasm` and the test that checks the committed bytes).
 *
 * @example
 * const bytes = await compileTreeKernel(); // Uint8Array, a valid module
 */
export function compileTreeKernel(): Promise<Uint8Array> {
  return compileWat("tree-kernel.wat", treeKernelWat());
}
