import { COORDINATE_PAGE_SHIFT } from "../head-state.js";

/** Largest number of f64x2 lane pairs a kernel function is generated for: blocks of up to 12 heads. */
export const MAX_KERNEL_PAIRS = 6;

/**
 * The WebAssembly text of the FTRL-Proximal kernel (McMahan et al. 2013,
 * Algorithm 1) over a block of heads, two heads per f64x2 vector. It is the
 * same arithmetic as trainHeadBlock (train-head-block.ts), operation for
 * operation and in the same order, and WebAssembly's f64x2 add, mul, div, sqrt,
 * min and max round each lane as IEEE 754 double operations do, so both give
 * the same bits; the test compares them. What it gains: two heads per square
 * root and division, no bounds checks, and z and n of a coordinate side by side.
 *
 * Memory (imported, shared): per coordinate c, at z + c * stride, the block's
 * `lanes` z values then its `lanes` n values (lanes even; a padding head has
 * z = n = 0 and gradient 0 and stays 0). Per row, `score{P}` reads the row's
 * coordinates (index region, entries start..end), stores each weight and
 * sqrt(n) in scratch and the logits at `logit`; the caller then writes the
 * gradients at `grad` and calls `update{P}` with the same entries, which also
 * sets the byte of each updated coordinate's page (c >> PAGE_SHIFT) at `pages`,
 * so that only those pages are copied back. P is the number of lane pairs,
 * 1..MAX_KERNEL_PAIRS, each function fully unrolled.
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

const GLOBALS = [
  "z",
  "n",
  "stride",
  "idx",
  "val",
  "hasVal",
  "ws",
  "ss",
  "logit",
  "grad",
  "bw",
  "bs",
  "pages",
]
  .map((name) => `  (global $${name} (mut i32) (i32.const 0))`)
  .concat(
    ["invAlpha", "beta", "l1", "negL1", "l2"].map(
      (name) => `  (global $${name} (mut v128) (v128.const i64x2 0 0))`,
    ),
    // Loads of the next row's coordinates go here, so they are not dropped as dead.
    ["  (global $sink (mut f64) (f64.const 0))"],
  )
  .join("\n");

/** Addresses are byte offsets into the shared memory; stride is bytes per coordinate. */
const CONFIGURE = `  (func (export "configure")
    (param $z i32) (param $lanes i32) (param $idx i32) (param $val i32) (param $hasVal i32)
    (param $ws i32) (param $ss i32) (param $logit i32) (param $grad i32) (param $bw i32) (param $bs i32)
    (param $pages i32) (param $invAlpha f64) (param $beta f64) (param $l1 f64) (param $l2 f64)
    (global.set $z (local.get $z)) (global.set $pages (local.get $pages))
    (global.set $n (i32.add (local.get $z) (i32.shl (local.get $lanes) (i32.const 3))))
    (global.set $stride (i32.shl (local.get $lanes) (i32.const 4)))
    (global.set $idx (local.get $idx)) (global.set $val (local.get $val))
    (global.set $hasVal (local.get $hasVal))
    (global.set $ws (local.get $ws)) (global.set $ss (local.get $ss))
    (global.set $logit (local.get $logit)) (global.set $grad (local.get $grad))
    (global.set $bw (local.get $bw)) (global.set $bs (local.get $bs))
    (global.set $invAlpha (f64x2.splat (local.get $invAlpha)))
    (global.set $beta (f64x2.splat (local.get $beta)))
    (global.set $l1 (f64x2.splat (local.get $l1)))
    (global.set $negL1 (f64x2.splat (f64.neg (local.get $l1))))
    (global.set $l2 (f64x2.splat (local.get $l2))))`;

function unrolled(pairs: number, body: (at: number, pair: number) => string): string {
  return Array.from({ length: pairs }, (_, p) => body(p * 16, p)).join("\n");
}

/** Entry k's coordinate address into $zp and $np (z and n of its first lane). */
const COORDINATE = `(local.set $zp (i32.mul (i32.load (i32.add (global.get $idx) (i32.shl (local.get $k) (i32.const 2)))) (global.get $stride)))
      (local.set $np (i32.add (global.get $n) (local.get $zp)))
      (local.set $zp (i32.add (global.get $z) (local.get $zp)))`;

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
  return `  (func (export "score${pairs}") (param $start i32) (param $end i32) (param $bias i32) (param $nextEnd i32)
    (local $k i32) (local $zp i32) (local $np i32) (local $o i32) (local $ssd i32) (local $touch f64)
    (local $zv v128) (local $s v128) (local $w v128) (local $x v128)
    (local $ia v128) (local $be v128) (local $l1 v128) (local $nl1 v128) (local $l2 v128)
    ${unrolled(pairs, (_, p) => `(local $acc${p} v128)`)}
    ;; Touch the next row's coordinates (end..nextEnd): their cache misses overlap this row's work.
    ;; A coordinate's z and n span up to two cache lines: touch its first and last byte.
    (local.set $k (local.get $end))
    (block $touched (loop $touch
      (br_if $touched (i32.ge_u (local.get $k) (local.get $nextEnd)))
      (local.set $zp (i32.add (global.get $z)
        (i32.mul (i32.load (i32.add (global.get $idx) (i32.shl (local.get $k) (i32.const 2)))) (global.get $stride))))
      (local.set $touch (f64.add (local.get $touch) (f64.add (f64.load (local.get $zp))
        (f64.load (i32.sub (i32.add (local.get $zp) (global.get $stride)) (i32.const 8))))))
      (local.set $k (i32.add (local.get $k) (i32.const 1)))
      (br $touch)))
    (global.set $sink (local.get $touch))
    (local.set $ia (global.get $invAlpha)) (local.set $be (global.get $beta))
    (local.set $l1 (global.get $l1)) (local.set $nl1 (global.get $negL1)) (local.set $l2 (global.get $l2))
    (local.set $ssd (i32.sub (global.get $ss) (global.get $ws)))
    (local.set $zp (i32.add (global.get $z) (i32.mul (local.get $bias) (global.get $stride))))
    (local.set $np (i32.add (global.get $n) (i32.mul (local.get $bias) (global.get $stride))))
    ${unrolled(
      pairs,
      (at, p) => `(local.set $zv (v128.load offset=${at} (local.get $zp)))
    (local.set $s (f64x2.sqrt (v128.load offset=${at} (local.get $np))))
    (local.set $w ${weight(true)})
    (v128.store offset=${at} (global.get $bs) (local.get $s))
    (v128.store offset=${at} (global.get $bw) (local.get $w))
    (local.set $acc${p} (local.get $w))`,
    )}
    (local.set $x (v128.const f64x2 1 1))
    (local.set $o (global.get $ws))
    (local.set $k (local.get $start))
    (block $rowDone (loop $entry
      (br_if $rowDone (i32.ge_u (local.get $k) (local.get $end)))
      ${COORDINATE}
      ${ENTRY_VALUE}
      ${unrolled(
        pairs,
        (at, p) => `(local.set $zv (v128.load offset=${at} (local.get $zp)))
      (local.set $s (f64x2.sqrt (v128.load offset=${at} (local.get $np))))
      (local.set $w ${weight(false)})
      (v128.store offset=${at} (local.get $o) (local.get $w))
      (v128.store offset=${at} (i32.add (local.get $o) (local.get $ssd)) (local.get $s))
      (local.set $acc${p} (f64x2.add (local.get $acc${p}) (f64x2.mul (local.get $w) (local.get $x))))`,
      )}
      (local.set $o (i32.add (local.get $o) (i32.const ${pairs * 16})))
      (local.set $k (i32.add (local.get $k) (i32.const 1)))
      (br $entry)))
    ${unrolled(pairs, (at, p) => `(v128.store offset=${at} (global.get $logit) (local.get $acc${p}))`)})`;
}

/**
 * n1 = n + g^2; z += g - (sqrt(n1) - sqrt(n)) / alpha * w; n = n1. A repeated
 * coordinate (adjacent equal entries: a hash collision) takes sqrt of its new n,
 * with the weight it was scored with, as the JavaScript kernel does.
 */
function zUpdate(at: number, gradient: string, sqrtN: string, w: string): string {
  return `(v128.store offset=${at} (local.get $zp)
        (f64x2.add (v128.load offset=${at} (local.get $zp))
          (f64x2.sub ${gradient}
            (f64x2.mul (f64x2.mul (f64x2.sub (f64x2.sqrt (local.get $n1)) ${sqrtN}) (local.get $ia)) ${w}))))
      (v128.store offset=${at} (local.get $np) (local.get $n1))`;
}

/** Marks the page of coordinate `coordinate` (an i32 expression) as updated. */
function markPage(coordinate: string): string {
  return `(i32.store8 (i32.add (global.get $pages) (i32.shr_u ${coordinate} (i32.const ${COORDINATE_PAGE_SHIFT}))) (i32.const 1))`;
}

function updateFunction(pairs: number): string {
  return `  (func (export "update${pairs}") (param $start i32) (param $end i32) (param $bias i32)
    (local $k i32) (local $zp i32) (local $np i32) (local $o i32) (local $ssd i32)
    (local $c i32) (local $previous i32) (local $repeated i32)
    (local $g v128) (local $n0 v128) (local $n1 v128) (local $s0 v128) (local $x v128) (local $ia v128)
    ${unrolled(pairs, (_, p) => `(local $g${p} v128)`)}
    (local.set $ia (global.get $invAlpha))
    (local.set $ssd (i32.sub (global.get $ss) (global.get $ws)))
    ${markPage("(local.get $bias)")}
    (local.set $zp (i32.add (global.get $z) (i32.mul (local.get $bias) (global.get $stride))))
    (local.set $np (i32.add (global.get $n) (i32.mul (local.get $bias) (global.get $stride))))
    ${unrolled(
      pairs,
      (at, p) => `(local.set $g${p} (v128.load offset=${at} (global.get $grad)))
    (local.set $n1 (f64x2.add (v128.load offset=${at} (local.get $np)) (f64x2.mul (local.get $g${p}) (local.get $g${p}))))
    ${zUpdate(at, `(local.get $g${p})`, `(v128.load offset=${at} (global.get $bs))`, `(v128.load offset=${at} (global.get $bw))`)}`,
    )}
    (local.set $x (v128.const f64x2 1 1))
    (local.set $o (global.get $ws))
    (local.set $previous (i32.const -1))
    (local.set $k (local.get $start))
    (block $rowDone (loop $entry
      (br_if $rowDone (i32.ge_u (local.get $k) (local.get $end)))
      (local.set $c (i32.load (i32.add (global.get $idx) (i32.shl (local.get $k) (i32.const 2)))))
      (local.set $repeated (i32.eq (local.get $c) (local.get $previous)))
      (local.set $previous (local.get $c))
      ${markPage("(local.get $c)")}
      (local.set $zp (i32.mul (local.get $c) (global.get $stride)))
      (local.set $np (i32.add (global.get $n) (local.get $zp)))
      (local.set $zp (i32.add (global.get $z) (local.get $zp)))
      ${ENTRY_VALUE}
      ${unrolled(
        pairs,
        (at, p) => `(local.set $g (f64x2.mul (local.get $g${p}) (local.get $x)))
      (local.set $n0 (v128.load offset=${at} (local.get $np)))
      (local.set $n1 (f64x2.add (local.get $n0) (f64x2.mul (local.get $g) (local.get $g))))
      (local.set $s0 (if (result v128) (local.get $repeated)
        (then (f64x2.sqrt (local.get $n0)))
        (else (v128.load offset=${at} (i32.add (local.get $o) (local.get $ssd))))))
      ${zUpdate(at, "(local.get $g)", "(local.get $s0)", `(v128.load offset=${at} (local.get $o))`)}`,
      )}
      (local.set $o (i32.add (local.get $o) (i32.const ${pairs * 16})))
      (local.set $k (i32.add (local.get $k) (i32.const 1)))
      (br $entry))))`;
}
