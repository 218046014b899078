import {
  EXP_NEG_MIN_ARG,
  EXP_NEG_ROUND_SCALE,
  LN2_OVER_64_HI,
  LN2_OVER_64_LO,
} from "../logistic-tables.js";

/**
 * The WebAssembly text of the gradient functions of the tree kernel (see
 * treeKernelWat): `gradients(score, label, validation, out, position, start, end,
 * results, step, pow2)` is the loop of logLossGradients without weights
 * (log-loss-gradients.ts), operation for operation in the same order (the same
 * exp from the same tables, at `step` and `pow2`; x / 120 a division, as there),
 * so the same bits; validation 0 means no validation rows. `gradients2` is the
 * same for an even number of rows, two rows per f64x2 vector. Both continue the
 * loop's running sums at `results` (f64 trainLinear, trainProduct, validLinear,
 * validProduct, then i32 trainScaled, validScaled, validCount), which the caller
 * starts and finishes (Math.log has no WebAssembly instruction), and return the
 * position after the last packed pair.
 *
 * @example
 * const text = gradientFunctionsWat(); // two "(func ...)" of the module
 */
export function gradientFunctionsWat(): string {
  return `${GRADIENTS_FUNCTION}\n${GRADIENTS2_FUNCTION}`;
}

/** A double as WebAssembly text: JavaScript's shortest round-trip form, so the same bits. */
function f64(value: number): string {
  return `(f64.const ${String(value)})`;
}

const GRADIENT_PARAMS = `(param $score i32) (param $label i32) (param $validation i32) (param $out i32)
    (param $position i32) (param $start i32) (param $end i32) (param $results i32) (param $step i32)
    (param $pow2 i32) (result i32)
    (local $r i32) (local $packed i32) (local $m i32) (local $k i32)
    (local $s f64) (local $y f64) (local $a f64) (local $x f64) (local $e f64) (local $inverse f64)
    (local $p f64) (local $linear f64) (local $factor f64) (local $g f64) (local $h f64)
    (local $trainLinear f64) (local $trainProduct f64) (local $validLinear f64) (local $validProduct f64)
    (local $trainScaled i32) (local $validScaled i32) (local $validCount i32)`;

/** The running sums continue from `results` (the caller starts them), so calls can be chained. */
const LOAD_SUMS = `    (local.set $trainLinear (f64.load offset=0 (local.get $results)))
    (local.set $trainProduct (f64.load offset=8 (local.get $results)))
    (local.set $validLinear (f64.load offset=16 (local.get $results)))
    (local.set $validProduct (f64.load offset=24 (local.get $results)))
    (local.set $trainScaled (i32.load offset=32 (local.get $results)))
    (local.set $validScaled (i32.load offset=36 (local.get $results)))
    (local.set $validCount (i32.load offset=40 (local.get $results)))
    (local.set $packed (local.get $position))`;

const STORE_SUMS = `    (f64.store offset=0 (local.get $results) (local.get $trainLinear))
    (f64.store offset=8 (local.get $results) (local.get $trainProduct))
    (f64.store offset=16 (local.get $results) (local.get $validLinear))
    (f64.store offset=24 (local.get $results) (local.get $validProduct))
    (i32.store offset=32 (local.get $results) (local.get $trainScaled))
    (i32.store offset=36 (local.get $results) (local.get $validScaled))
    (i32.store offset=40 (local.get $results) (local.get $validCount))
    (local.get $packed)`;

/**
 * Row `row`'s share of the sums and its pair, from $linear, $factor, $g and $h:
 * in row order, as the JavaScript loop adds and multiplies them.
 */
function accumulateRow(row: string): string {
  return `      (if (i32.and (i32.ne (local.get $validation) (i32.const 0))
            (i32.eq (i32.load8_u (i32.add (local.get $validation) ${row})) (i32.const 1)))
        (then
          (local.set $validLinear (f64.add (local.get $validLinear) (local.get $linear)))
          (local.set $validProduct (f64.mul (local.get $validProduct) (local.get $factor)))
          (if (f64.lt (local.get $validProduct) ${f64(2 ** -512)}) (then
            (local.set $validProduct (f64.mul (local.get $validProduct) ${f64(2 ** 512)}))
            (local.set $validScaled (i32.add (local.get $validScaled) (i32.const 1)))))
          (local.set $validCount (i32.add (local.get $validCount) (i32.const 1)))
          (if (i32.lt_s (local.get $position) (i32.const 0)) (then
            (v128.store (i32.add (local.get $out) (i32.shl ${row} (i32.const 4)))
              (v128.const i64x2 0 0)))))
        (else
          (local.set $trainLinear (f64.add (local.get $trainLinear) (local.get $linear)))
          (local.set $trainProduct (f64.mul (local.get $trainProduct) (local.get $factor)))
          (if (f64.lt (local.get $trainProduct) ${f64(2 ** -512)}) (then
            (local.set $trainProduct (f64.mul (local.get $trainProduct) ${f64(2 ** 512)}))
            (local.set $trainScaled (i32.add (local.get $trainScaled) (i32.const 1)))))
          (if (i32.lt_s (local.get $position) (i32.const 0))
            (then (local.set $k ${row}))
            (else
              (local.set $k (local.get $packed))
              (local.set $packed (i32.add (local.get $packed) (i32.const 1)))))
          (local.set $k (i32.add (local.get $out) (i32.shl (local.get $k) (i32.const 4))))
          (f64.store (local.get $k) (local.get $g))
          (f64.store offset=8 (local.get $k) (local.get $h))))`;
}

/** The exp polynomial 1 + x (1 + x (1/2 + x (1/6 + x (1/24 + x / 120)))) in `t` arithmetic (f64 or f64x2). */
function expPolynomial(t: "f64" | "f64x2", x: string): string {
  const c = (value: number): string =>
    t === "f64" ? f64(value) : `(v128.const f64x2 ${String(value)} ${String(value)})`;
  return `(${t}.add ${c(1)} (${t}.mul ${x}
            (${t}.add ${c(1)} (${t}.mul ${x}
              (${t}.add ${c(0.5)} (${t}.mul ${x}
                (${t}.add ${c(1 / 6)} (${t}.mul ${x}
                  (${t}.add ${c(1 / 24)} (${t}.div ${x} ${c(120)}))))))))))`;
}

const GRADIENTS_FUNCTION = `  (func (export "gradients") ${GRADIENT_PARAMS}
${LOAD_SUMS}
    (local.set $r (local.get $start))
    (if (i32.lt_s (local.get $r) (local.get $end)) (then
    (loop $rows
      (local.set $s (f64.load (i32.add (local.get $score) (i32.shl (local.get $r) (i32.const 3)))))
      (local.set $y (f64.convert_i32_u (i32.load8_u (i32.add (local.get $label) (local.get $r)))))
      (local.set $a (f64.neg (f64.abs (local.get $s))))
      (local.set $e ${f64(0)})
      (if (f64.ge (local.get $a) ${f64(EXP_NEG_MIN_ARG)}) (then
        (local.set $m (i32.trunc_f64_s
          (f64.add (f64.mul (f64.neg (local.get $a)) ${f64(EXP_NEG_ROUND_SCALE)}) ${f64(0.5)})))
        (local.set $x (f64.add
          (f64.add (local.get $a) (f64.mul (f64.convert_i32_s (local.get $m)) ${f64(LN2_OVER_64_HI)}))
          (f64.mul (f64.convert_i32_s (local.get $m)) ${f64(LN2_OVER_64_LO)})))
        (local.set $e (f64.mul (f64.mul
          ${expPolynomial("f64", "(local.get $x)")}
          (f64.load (i32.add (local.get $step) (i32.shl (i32.and (local.get $m) (i32.const 63)) (i32.const 3)))))
          (f64.load (i32.add (local.get $pow2) (i32.shl (i32.shr_s (local.get $m) (i32.const 6)) (i32.const 3))))))))
      (local.set $inverse (f64.div ${f64(1)} (f64.add ${f64(1)} (local.get $e))))
      (local.set $p (select (local.get $inverse) (f64.mul (local.get $e) (local.get $inverse))
        (f64.ge (local.get $s) ${f64(0)})))
      (local.set $linear (f64.sub
        (select (local.get $s) ${f64(0)} (f64.gt (local.get $s) ${f64(0)}))
        (f64.mul (local.get $y) (local.get $s))))
      (local.set $factor (local.get $inverse))
      (if (f64.lt (local.get $e) ${f64(2 ** -26)}) (then
        (local.set $linear (f64.add (local.get $linear)
          (f64.sub (local.get $e) (f64.mul (f64.mul ${f64(0.5)} (local.get $e)) (local.get $e)))))
        (local.set $factor ${f64(1)})))
      (local.set $g (f64.sub (local.get $p) (local.get $y)))
      (local.set $h (f64.mul (f64.mul (local.get $e) (local.get $inverse)) (local.get $inverse)))
${accumulateRow("(local.get $r)")}
      (local.set $r (i32.add (local.get $r) (i32.const 1)))
      (br_if $rows (i32.lt_s (local.get $r) (local.get $end)))
    )))
${STORE_SUMS}
  )`;

/** f64x2 constant of one value in both lanes. */
function f64x2(value: number): string {
  return `(v128.const f64x2 ${String(value)} ${String(value)})`;
}

/**
 * Rows in pairs (end - start even): the per-row arithmetic two rows at a time in
 * f64x2 lanes (each lane rounds as the scalar operation does), then the sums and
 * the pairs row by row in row order. Rows with a < -745 take e = 0, as in the
 * scalar loop; their m saturates and is clamped so the table reads stay in range.
 */
const GRADIENTS2_FUNCTION = `  (func (export "gradients2") ${GRADIENT_PARAMS}
    (local $sv v128) (local $av v128) (local $mi v128) (local $mv v128) (local $xv v128) (local $ev v128)
    (local $iv v128) (local $yv v128) (local $pv v128) (local $lv v128) (local $fv v128) (local $small v128)
    (local $gv v128) (local $hv v128) (local $m1 i32)
${LOAD_SUMS}
    (local.set $r (local.get $start))
    (if (i32.lt_s (local.get $r) (local.get $end)) (then
    (loop $rows
      (local.set $sv (v128.load (i32.add (local.get $score) (i32.shl (local.get $r) (i32.const 3)))))
      (local.set $yv (f64x2.replace_lane 1
        (f64x2.splat (f64.convert_i32_u (i32.load8_u (i32.add (local.get $label) (local.get $r)))))
        (f64.convert_i32_u (i32.load8_u offset=1 (i32.add (local.get $label) (local.get $r))))))
      (local.set $av (f64x2.neg (f64x2.abs (local.get $sv))))
      (local.set $mi (i32x4.min_s (i32x4.trunc_sat_f64x2_s_zero
        (f64x2.add (f64x2.mul (f64x2.neg (local.get $av)) ${f64x2(EXP_NEG_ROUND_SCALE)}) ${f64x2(0.5)}))
        (i32x4.splat (i32.const 68800))))
      (local.set $mv (f64x2.convert_low_i32x4_s (local.get $mi)))
      (local.set $xv (f64x2.add
        (f64x2.add (local.get $av) (f64x2.mul (local.get $mv) ${f64x2(LN2_OVER_64_HI)}))
        (f64x2.mul (local.get $mv) ${f64x2(LN2_OVER_64_LO)})))
      (local.set $m (i32x4.extract_lane 0 (local.get $mi)))
      (local.set $m1 (i32x4.extract_lane 1 (local.get $mi)))
      (local.set $ev (f64x2.mul (f64x2.mul
          ${expPolynomial("f64x2", "(local.get $xv)")}
          (f64x2.replace_lane 1
            (f64x2.splat (f64.load (i32.add (local.get $step) (i32.shl (i32.and (local.get $m) (i32.const 63)) (i32.const 3)))))
            (f64.load (i32.add (local.get $step) (i32.shl (i32.and (local.get $m1) (i32.const 63)) (i32.const 3))))))
          (f64x2.replace_lane 1
            (f64x2.splat (f64.load (i32.add (local.get $pow2) (i32.shl (i32.shr_s (local.get $m) (i32.const 6)) (i32.const 3)))))
            (f64.load (i32.add (local.get $pow2) (i32.shl (i32.shr_s (local.get $m1) (i32.const 6)) (i32.const 3)))))))
      (local.set $ev (v128.and (local.get $ev) (f64x2.ge (local.get $av) ${f64x2(EXP_NEG_MIN_ARG)})))
      (local.set $iv (f64x2.div ${f64x2(1)} (f64x2.add ${f64x2(1)} (local.get $ev))))
      (local.set $pv (v128.bitselect (local.get $iv) (f64x2.mul (local.get $ev) (local.get $iv))
        (f64x2.ge (local.get $sv) ${f64x2(0)})))
      (local.set $lv (f64x2.sub
        (v128.and (local.get $sv) (f64x2.gt (local.get $sv) ${f64x2(0)}))
        (f64x2.mul (local.get $yv) (local.get $sv))))
      (local.set $small (f64x2.lt (local.get $ev) ${f64x2(2 ** -26)}))
      (local.set $lv (v128.bitselect
        (f64x2.add (local.get $lv)
          (f64x2.sub (local.get $ev) (f64x2.mul (f64x2.mul ${f64x2(0.5)} (local.get $ev)) (local.get $ev))))
        (local.get $lv) (local.get $small)))
      (local.set $fv (v128.bitselect ${f64x2(1)} (local.get $iv) (local.get $small)))
      (local.set $gv (f64x2.sub (local.get $pv) (local.get $yv)))
      (local.set $hv (f64x2.mul (f64x2.mul (local.get $ev) (local.get $iv)) (local.get $iv)))
      (local.set $linear (f64x2.extract_lane 0 (local.get $lv)))
      (local.set $factor (f64x2.extract_lane 0 (local.get $fv)))
      (local.set $g (f64x2.extract_lane 0 (local.get $gv)))
      (local.set $h (f64x2.extract_lane 0 (local.get $hv)))
${accumulateRow("(local.get $r)")}
      (local.set $linear (f64x2.extract_lane 1 (local.get $lv)))
      (local.set $factor (f64x2.extract_lane 1 (local.get $fv)))
      (local.set $g (f64x2.extract_lane 1 (local.get $gv)))
      (local.set $h (f64x2.extract_lane 1 (local.get $hv)))
${accumulateRow("(i32.add (local.get $r) (i32.const 1))")}
      (local.set $r (i32.add (local.get $r) (i32.const 2)))
      (br_if $rows (i32.lt_s (local.get $r) (local.get $end)))
    )))
${STORE_SUMS}
  )`;
