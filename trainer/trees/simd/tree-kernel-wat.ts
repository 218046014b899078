import { gradientFunctionsWat } from "./gradient-kernel-wat.js";

/** Column groups of the histogram kernel: `hist{K}` adds K columns per pass, K = 1 .. 8. */
export const MAX_HISTOGRAM_COLUMNS = 8;

/** Row widths of the partition kernel: `part{W}` moves rows of W 32-bit words, W = 1 .. 8. */
export const MAX_PARTITION_WORDS = 8;

/** Bytes of one column's histogram: 256 slots of a (gradient, hessian) pair of doubles. */
const COLUMN_BYTES = 256 * 16;

/**
 * The WebAssembly text of the tree learner's kernels. The histograms: the same sums as
 * accumulateHistogram (histogram-kernel.ts), row after row for every slot, so the
 * same bits. Each slot's (gradient, hessian) pair is one f64x2 load, add and
 * store, and f64x2.add rounds each lane as a double addition does, so the pair
 * added as one vector equals two scalar additions; what it gains is half the
 * operations and no bounds checks. Slot addresses come from immediates: column
 * k of a pass at offset k * 4096 from the pass's histogram, its bin byte at
 * offset k from the row's bins.
 *
 * `hist{K}(bins, stride, count, pairs, hist)`, byte addresses in the imported
 * shared memory: `count` rows, row i's K bins at bins + i * stride, its pair at
 * pairs + 16 i, added to the K column histograms from `hist` on.
 *
 * `part{W}(placed, ordered, start, end, column, table, gradScratch, rowScratch)`
 * is partitionRows (partition-rows.ts) for rows of W words (stride 4 W): the
 * same stable, branchless split of positions start .. end - 1 by the 256-byte
 * table at `table`, the right rows gathered in the scratch and copied back
 * after the left ones (memory.copy); returns the end of the left rows. It moves
 * bytes and adds nothing, so it equals the JavaScript kernel exactly.
 *
 * `traverse(bins, columnCount, start, end, depth, nodeColumn, goesRight, leafValue,
 * score)` is addTreeToScores (add-tree-to-scores.ts): rows go down the tree
 * TRAVERSE_ROWS at a time (their chains of dependent loads overlap), and each
 * adds its leaf's value to its score, the one addition the JavaScript makes.
 *
 * `gradients` and `gradients2` are the loop of logLossGradients without weights
 * (see gradient-kernel-wat.ts).
 *
 * @example
 * const text = treeKernelWat(); // "(module ...)", compiled by compileTreeKernel
 */
export function treeKernelWat(): string {
  const functions: string[] = [];
  for (let k = 1; k <= MAX_HISTOGRAM_COLUMNS; k++) functions.push(histogramFunction(k));
  for (let w = 1; w <= MAX_PARTITION_WORDS; w++) functions.push(partitionFunction(w));
  functions.push(gradientFunctionsWat(), traverseFunction(TRAVERSE_ROWS));
  return `(module
  (import "env" "memory" (memory 1 65536 shared))
${functions.join("\n")}
)
`;
}

function histogramFunction(columns: number): string {
  const updates: string[] = [];
  for (let k = 0; k < columns; k++) {
    const offset = k * COLUMN_BYTES;
    updates.push(
      `      (local.set $a (i32.add (local.get $hist) (i32.shl (i32.load8_u offset=${k} (local.get $bins)) (i32.const 4))))
      (v128.store offset=${offset} (local.get $a) (f64x2.add (v128.load offset=${offset} (local.get $a)) (local.get $v)))`,
    );
  }
  return `  (func (export "hist${columns}")
    (param $bins i32) (param $stride i32) (param $count i32) (param $pairs i32) (param $hist i32)
    (local $end i32) (local $a i32) (local $v v128)
    (if (i32.le_s (local.get $count) (i32.const 0)) (then (return)))
    (local.set $end (i32.add (local.get $pairs) (i32.shl (local.get $count) (i32.const 4))))
    (loop $rows
      (local.set $v (v128.load (local.get $pairs)))
${updates.join("\n")}
      (local.set $bins (i32.add (local.get $bins) (local.get $stride)))
      (local.set $pairs (i32.add (local.get $pairs) (i32.const 16)))
      (br_if $rows (i32.lt_u (local.get $pairs) (local.get $end)))
    )
  )`;
}

/** Row copies of `words` 32-bit words: 16, 8 then 4 bytes at a time. */
function rowChunks(words: number): { type: "v128" | "i64" | "i32"; offset: number }[] {
  const chunks: { type: "v128" | "i64" | "i32"; offset: number }[] = [];
  let offset = 0;
  for (let left = words; left > 0;) {
    const type = left >= 4 ? "v128" : left >= 2 ? "i64" : "i32";
    const taken = type === "v128" ? 4 : type === "i64" ? 2 : 1;
    chunks.push({ type, offset });
    offset += 4 * taken;
    left -= taken;
  }
  return chunks;
}

function partitionFunction(words: number): string {
  const stride = 4 * words;
  const chunks = rowChunks(words);
  const locals = chunks.map((c, j) => `(local $r${j} ${c.type})`).join(" ");
  const loads = chunks
    .map((c, j) => `      (local.set $r${j} (${c.type}.load offset=${c.offset} (local.get $src)))`)
    .join("\n");
  const stores = (at: string): string =>
    chunks
      .map(
        (c, j) => `      (${c.type}.store offset=${c.offset} (local.get ${at}) (local.get $r${j}))`,
      )
      .join("\n");
  return `  (func (export "part${words}")
    (param $placed i32) (param $ordered i32) (param $start i32) (param $end i32) (param $column i32)
    (param $table i32) (param $gs i32) (param $ws i32) (result i32)
    (local $i i32) (local $left i32) (local $right i32) (local $t i32) (local $src i32) (local $at i32)
    (local $v v128) ${locals}
    (local.set $i (local.get $start))
    (local.set $left (local.get $start))
    (if (i32.lt_s (local.get $start) (local.get $end)) (then
    (loop $rows
      (local.set $src (i32.add (local.get $placed) (i32.mul (local.get $i) (i32.const ${stride}))))
      (local.set $v (v128.load (i32.add (local.get $ordered) (i32.shl (local.get $i) (i32.const 4)))))
${loads}
      (local.set $t (i32.load8_u (i32.add (local.get $table)
        (i32.load8_u (i32.add (local.get $src) (local.get $column))))))
      (local.set $at (i32.add (local.get $placed) (i32.mul (local.get $left) (i32.const ${stride}))))
${stores("$at")}
      (v128.store (i32.add (local.get $ordered) (i32.shl (local.get $left) (i32.const 4))) (local.get $v))
      (local.set $at (i32.add (local.get $ws) (i32.mul (local.get $right) (i32.const ${stride}))))
${stores("$at")}
      (v128.store (i32.add (local.get $gs) (i32.shl (local.get $right) (i32.const 4))) (local.get $v))
      (local.set $left (i32.sub (i32.add (local.get $left) (i32.const 1)) (local.get $t)))
      (local.set $right (i32.add (local.get $right) (local.get $t)))
      (local.set $i (i32.add (local.get $i) (i32.const 1)))
      (br_if $rows (i32.lt_s (local.get $i) (local.get $end)))
    )))
    (memory.copy (i32.add (local.get $ordered) (i32.shl (local.get $left) (i32.const 4)))
      (local.get $gs) (i32.shl (local.get $right) (i32.const 4)))
    (memory.copy (i32.add (local.get $placed) (i32.mul (local.get $left) (i32.const ${stride})))
      (local.get $ws) (i32.mul (local.get $right) (i32.const ${stride})))
    (local.get $left)
  )`;
}

/** Rows that go down the tree together in `traverse`. */
const TRAVERSE_ROWS = 8;

function traverseFunction(rows: number): string {
  const js = Array.from({ length: rows }, (_, j) => j);
  const step = (node: string, at: string): string =>
    `(i32.add (i32.add (i32.shl (local.get ${node}) (i32.const 1)) (i32.const 1))
          (i32.load8_u (i32.add (i32.add (local.get $goesRight) (i32.shl (local.get ${node}) (i32.const 8)))
            (i32.load8_u (i32.add ${at}
              (i32.load (i32.add (local.get $nodeColumn) (i32.shl (local.get ${node}) (i32.const 2)))))))))`;
  const addLeaf = (node: string, row: string): string =>
    `      (local.set $k (i32.add (local.get $score) (i32.shl ${row} (i32.const 3))))
      (f64.store (local.get $k) (f64.add (f64.load (local.get $k))
        (f64.load (i32.add (local.get $leafValue)
          (i32.shl (i32.sub (local.get ${node}) (local.get $firstLeaf)) (i32.const 3))))))`;
  return `  (func (export "traverse")
    (param $bins i32) (param $columnCount i32) (param $start i32) (param $end i32) (param $depth i32)
    (param $nodeColumn i32) (param $goesRight i32) (param $leafValue i32) (param $score i32)
    (local $r i32) (local $d i32) (local $k i32) (local $at i32) (local $firstLeaf i32) (local $n i32)
    ${js.map((j) => `(local $n${j} i32) (local $a${j} i32)`).join(" ")}
    (local.set $firstLeaf (i32.sub (i32.shl (i32.const 1) (local.get $depth)) (i32.const 1)))
    (local.set $r (local.get $start))
    (block $done (loop $groups
      (br_if $done (i32.gt_s (i32.add (local.get $r) (i32.const ${rows - 1})) (i32.sub (local.get $end) (i32.const 1))))
      (local.set $a0 (i32.add (local.get $bins) (i32.mul (local.get $r) (local.get $columnCount))))
${js
  .slice(1)
  .map((j) => `      (local.set $a${j} (i32.add (local.get $a${j - 1}) (local.get $columnCount)))`)
  .join("\n")}
${js.map((j) => `      (local.set $n${j} (i32.const 0))`).join("\n")}
      (local.set $d (i32.const 0))
      (block $walked (loop $levels
        (br_if $walked (i32.ge_s (local.get $d) (local.get $depth)))
${js.map((j) => `        (local.set $n${j} ${step(`$n${j}`, `(local.get $a${j})`)})`).join("\n")}
        (local.set $d (i32.add (local.get $d) (i32.const 1)))
        (br $levels)))
${js.map((j) => addLeaf(`$n${j}`, `(i32.add (local.get $r) (i32.const ${j}))`)).join("\n")}
      (local.set $r (i32.add (local.get $r) (i32.const ${rows})))
      (br $groups)))
    (block $tailDone (loop $tail
      (br_if $tailDone (i32.ge_s (local.get $r) (local.get $end)))
      (local.set $at (i32.add (local.get $bins) (i32.mul (local.get $r) (local.get $columnCount))))
      (local.set $n (i32.const 0))
      (local.set $d (i32.const 0))
      (block $walked (loop $levels
        (br_if $walked (i32.ge_s (local.get $d) (local.get $depth)))
        (local.set $n ${step("$n", "(local.get $at)")})
        (local.set $d (i32.add (local.get $d) (i32.const 1)))
        (br $levels)))
${addLeaf("$n", "(local.get $r)")}
      (local.set $r (i32.add (local.get $r) (i32.const 1)))
      (br $tail)))
  )`;
}
