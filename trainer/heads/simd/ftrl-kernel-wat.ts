import { COORDINATE_PAGE_SHIFT } from "../head-state.js";

/** Largest number of f64x2 lane pairs a kernel function is generated for: blocks of up to 12 heads. */
export const MAX_KERNEL_PAIRS = 6;

/** f64 values kept per lane and coordinate: z, n and sqrt(n). */
export const VALUES_PER_LANE = 3;

/**
 * The WebAssembly text of the FTRL-Proximal kernel (McMahan et al. 2013,
 * Algorithm 1) over a block of heads, two heads per f64x2 vector. It is the
 * same arithmetic as trainHeadBlock (train-head-block.ts), operation for
 * operation and in the same order, and WebAssembly's f64x2 add, mul, div, sqrt,
 * min and max round each lane as IEEE 754 double operations do, so both give
 * the same bits; the test compares them. What it gains: two heads per square
 * root and division, no bounds checks, one cache line or two per coordinate,
 * and one square root per update instead of two: sqrt(n) is kept beside n
 * (recomputing it gives the same bits, so it is only a cache).
 *
 * Memory (imported, shared): per coordinate c, at c * lanes * 24, the block's
 * `lanes` z values, `lanes` n values, then `lanes` sqrt(n) values (lanes = 2P
 * even; a padding head keeps z = n = 0 with gradient 0). Per row, `score{P}`
 * reads the row's coordinates (index region, entries start..end), stores each
 * weight in scratch and the logits at `logit`; the caller then writes the
 * gradients at `grad` and calls `update{P}` with the same entries, which also
 * sets the byte of each updated coordinate's page (c >> COORDINATE_PAGE_SHIFT)
 * at `pages`, so that only those pages are copied back. P is the number of lane
 * pairs, 1..MAX_KERNEL_PAIRS, each function fully unrolled.
 *
 * @example
 * const module = new WebAssembly.Module(wabt.parseWat("ftrl.wat", ftrlKernelWat(), { simd: true, threads: true }).toBinary({}).buffer);
 */
export function ftrlKernelWat(): string {
  const functions: string[] = [];
  for (let pairs = 1; pairs <= MAX_KERNEL_PAIRS; pairs++) {
    functions.push(scoreFunction(pairs), updateFunction(pairs));
  }
  return `(module
  (import "env" "memory" (memory 1 65536 shared))
${GLOBALS}
${CONFIGURE}
${functions.join("\n")}
)
`;
}

const GLOBALS = ["idx", "val", "hasVal", "ws", "logit", "grad", "bw", "pages"]
  .map((name) => `  (global $${name} (mut i32) (i32.const 0))`)
  .concat(
    ["invAlpha", "beta", "l1", "negL1", "l2"].map(
      (name) => `  (global $${name} (mut v128) (v128.const i64x2 0 0))`,
    ),
    // Loads of the next row's coordinates go here, so they are not dropped as dead.
    ["  (global $sink (mut f64) (f64.const 0))"],
  )
  .join("\n");

/** Addresses are byte offsets into the shared memory; the state starts at 0. */
const CONFIGURE = `  (func (export "configure")
    (param $idx i32) (param $val i32) (param $hasVal i32)
    (param $ws i32) (param $logit i32) (param $grad i32) (param $bw i32) (param $pages i32)
    (param $invAlpha f64) (param $beta f64) (param $l1 f64) (param $l2 f64)
    (global.set $idx (local.get $idx)) (global.set $val (local.get $val))
    (global.set $hasVal (local.get $hasVal))
    (global.set $ws (local.get $ws)) (global.set $logit (local.get $logit))
    (global.set $grad (local.get $grad)) (global.set $bw (local.get $bw))
    (global.set $pages (local.get $pages))
    (global.set $invAlpha (f64x2.splat (local.get $invAlpha)))
    (global.set $beta (f64x2.splat (local.get $beta)))
    (global.set $l1 (f64x2.splat (local.get $l1)))
    (global.set $negL1 (f64x2.splat (f64.neg (local.get $l1))))
    (global.set $l2 (f64x2.splat (local.get $l2))))`;

/** One copy of `body` per lane pair, given the pair's byte offset within a lane group. */
function unrolled(pairs: number, body: (at: number, pair: number) => string): string {
  return Array.from({ length: pairs }, (_, p) => body(p * 16, p)).join("\n");
}

/** Byte size of one coordinate's state, and where its n and sqrt(n) start. */
function layout(pairs: number): { stride: number; n: number; s: number } {
  return { stride: pairs * 16 * VALUES_PER_LANE, n: pairs * 16, s: pairs * 32 };
}

/** Address of coordinate `coordinate`'s state (an i32 expression). */
function stateAddress(pairs: number, coordinate: string): string {
  return `(i32.mul ${coordinate} (i32.const ${layout(pairs).stride}))`;
}

/** Coordinate of entry k. */
const ENTRY_COORDINATE =
  "(i32.load (i32.add (global.get $idx) (i32.shl (local.get $k) (i32.const 2))))";

/** x of entry k, or 1 for binary rows (x * w = w exactly, as in the JavaScript kernel). */
const ENTRY_VALUE = `(if (global.get $hasVal) (then
        (local.set $x (f64x2.splat (f64.load (i32.add (global.get $val) (i32.shl (local.get $k) (i32.const 3))))))))`;

/**
 * w = -(z - min(max(z, -lambda1), lambda1)) / ((beta + sqrt(n)) / alpha + lambda2),
 * as ftrlWeight; the bias has lambda1 = lambda2 = 0 (min(max(z, -0), 0), no + lambda2).
 */
function weight(bias: boolean): string {
  const clamp = bias
    ? "(f64x2.min (f64x2.max (local.get $zv) (v128.const f64x2 -0 -0)) (v128.const f64x2 0 0))"
    : "(f64x2.min (f64x2.max (local.get $zv) (local.get $nl1)) (local.get $l1))";
  const denominator = bias
    ? "(f64x2.mul (f64x2.add (local.get $be) (local.get $s)) (local.get $ia))"
    : "(f64x2.add (f64x2.mul (f64x2.add (local.get $be) (local.get $s)) (local.get $ia)) (local.get $l2))";
  return `(f64x2.div (f64x2.neg (f64x2.sub (local.get $zv) ${clamp})) ${denominator})`;
}

function scoreFunction(pairs: number): string {
  const { stride, s } = layout(pairs);
  return `  (func (export "score${pairs}") (param $start i32) (param $end i32) (param $bias i32) (param $nextEnd i32)
    (local $k i32) (local $p i32) (local $o i32) (local $touch f64)
    (local $zv v128) (local $s v128) (local $w v128) (local $x v128)
    (local $ia v128) (local $be v128) (local $l1 v128) (local $nl1 v128) (local $l2 v128)
    ${unrolled(pairs, (_, p) => `(local $acc${p} v128)`)}
    ;; Touch the first and last byte of each of the next row's coordinates (end..nextEnd):
    ;; their cache misses overlap this row's work.
    (local.set $k (local.get $end))
    (block $touched (loop $touch
      (br_if $touched (i32.ge_u (local.get $k) (local.get $nextEnd)))
      (local.set $p ${stateAddress(pairs, ENTRY_COORDINATE)})
      (local.set $touch (f64.add (local.get $touch)
        (f64.add (f64.load (local.get $p)) (f64.load offset=${stride - 8} (local.get $p)))))
      (local.set $k (i32.add (local.get $k) (i32.const 1)))
      (br $touch)))
    (global.set $sink (local.get $touch))
    (local.set $ia (global.get $invAlpha)) (local.set $be (global.get $beta))
    (local.set $l1 (global.get $l1)) (local.set $nl1 (global.get $negL1)) (local.set $l2 (global.get $l2))
    (local.set $p ${stateAddress(pairs, "(local.get $bias)")})
    ${unrolled(
      pairs,
      (at, p) => `(local.set $zv (v128.load offset=${at} (local.get $p)))
    (local.set $s (v128.load offset=${s + at} (local.get $p)))
    (local.set $w ${weight(true)})
    (v128.store offset=${at} (global.get $bw) (local.get $w))
    (local.set $acc${p} (local.get $w))`,
    )}
    (local.set $x (v128.const f64x2 1 1))
    (local.set $o (global.get $ws))
    (local.set $k (local.get $start))
    (block $rowDone (loop $entry
      (br_if $rowDone (i32.ge_u (local.get $k) (local.get $end)))
      (local.set $p ${stateAddress(pairs, ENTRY_COORDINATE)})
      ${ENTRY_VALUE}
      ${unrolled(
        pairs,
        (at, p) => `(local.set $zv (v128.load offset=${at} (local.get $p)))
      (local.set $s (v128.load offset=${s + at} (local.get $p)))
      (local.set $w ${weight(false)})
      (v128.store offset=${at} (local.get $o) (local.get $w))
      (local.set $acc${p} (f64x2.add (local.get $acc${p}) (f64x2.mul (local.get $w) (local.get $x))))`,
      )}
      (local.set $o (i32.add (local.get $o) (i32.const ${pairs * 16})))
      (local.set $k (i32.add (local.get $k) (i32.const 1)))
      (br $entry)))
    ${unrolled(pairs, (at, p) => `(v128.store offset=${at} (global.get $logit) (local.get $acc${p}))`)})`;
}

/**
 * n1 = n + g^2; z += g - (sqrt(n1) - sqrt(n)) / alpha * w; n = n1 (and its root).
 * A repeated coordinate (adjacent equal entries: a hash collision) is updated
 * again from its new n, with the weight it was scored with, as the JavaScript
 * kernel does.
 */
function zUpdate(pairs: number, at: number, gradient: string, w: string): string {
  const { n, s } = layout(pairs);
  return `(local.set $n1 (f64x2.add (v128.load offset=${n + at} (local.get $p)) (f64x2.mul ${gradient} ${gradient})))
      (local.set $s1 (f64x2.sqrt (local.get $n1)))
      (v128.store offset=${at} (local.get $p)
        (f64x2.add (v128.load offset=${at} (local.get $p))
          (f64x2.sub ${gradient}
            (f64x2.mul (f64x2.mul (f64x2.sub (local.get $s1) (v128.load offset=${s + at} (local.get $p))) (local.get $ia)) ${w}))))
      (v128.store offset=${n + at} (local.get $p) (local.get $n1))
      (v128.store offset=${s + at} (local.get $p) (local.get $s1))`;
}

/** Marks the page of coordinate `coordinate` (an i32 expression) as updated. */
function markPage(coordinate: string): string {
  return `(i32.store8 (i32.add (global.get $pages) (i32.shr_u ${coordinate} (i32.const ${COORDINATE_PAGE_SHIFT}))) (i32.const 1))`;
}

function updateFunction(pairs: number): string {
  return `  (func (export "update${pairs}") (param $start i32) (param $end i32) (param $bias i32)
    (local $k i32) (local $p i32) (local $o i32) (local $c i32)
    (local $g v128) (local $n1 v128) (local $s1 v128) (local $x v128) (local $ia v128)
    ${unrolled(pairs, (_, p) => `(local $g${p} v128)`)}
    (local.set $ia (global.get $invAlpha))
    ${markPage("(local.get $bias)")}
    (local.set $p ${stateAddress(pairs, "(local.get $bias)")})
    ${unrolled(
      pairs,
      (at, p) => `(local.set $g${p} (v128.load offset=${at} (global.get $grad)))
      ${zUpdate(pairs, at, `(local.get $g${p})`, `(v128.load offset=${at} (global.get $bw))`)}`,
    )}
    (local.set $x (v128.const f64x2 1 1))
    (local.set $o (global.get $ws))
    (local.set $k (local.get $start))
    (block $rowDone (loop $entry
      (br_if $rowDone (i32.ge_u (local.get $k) (local.get $end)))
      (local.set $c ${ENTRY_COORDINATE})
      ${markPage("(local.get $c)")}
      (local.set $p ${stateAddress(pairs, "(local.get $c)")})
      ${ENTRY_VALUE}
      ${unrolled(
        pairs,
        (at, p) => `(local.set $g (f64x2.mul (local.get $g${p}) (local.get $x)))
      ${zUpdate(pairs, at, "(local.get $g)", `(v128.load offset=${at} (local.get $o))`)}`,
      )}
      (local.set $o (i32.add (local.get $o) (i32.const ${pairs * 16})))
      (local.set $k (i32.add (local.get $k) (i32.const 1)))
      (br $entry))))`;
}
