import type { PlotlineChunkColumns } from "./plotline-columns.js";

/**
 * How often each outcome's uniform is the row's shared draw rather than its
 * own, in 32nds, PLOTLINE_OUTCOMES order: one 32-bit draw holds the six 5-bit
 * choices of a row. Hide takes the mirrored shared draw, so it leans against
 * the engagement outcomes.
 */
const SHARED_IN_32 = [16, 19, 16, 13, 16, 13];
const MIRRORED = [false, false, false, false, false, true];
/** Uniforms (on the 2^-53 grid) this stage takes per row: the shared one, the choices, one per outcome. */
export const LABEL_UNITS = 8;

/**
 * Kernel, stage 4 of a row: the six labels of chunk rows [from, to), drawn
 * from the true probabilities with LABEL_UNITS uniforms a row, through a
 * copula that correlates them while keeping each margin exact. Each
 * outcome k compares p_k with a uniform u_k that is, with chance c_k, the
 * row's shared uniform U (1 - U for hide) and otherwise a fresh one; a mixture
 * of uniforms is uniform, so P(label_k = 1) = P(u_k < p_k) = p_k exactly (to
 * the 2^-53 grid of the draws), while a low U makes open, react, reply, save
 * and reshare likely together and hide unlikely. (A mixture of the
 * independence copula with the co- and counter-monotone ones, the Frechet
 * family, rather than a Gaussian copula: exact margins without a normal CDF.)
 *
 * @example
 * drawPlotlineLabels(units, columns, 0, 1024);
 */
export function drawPlotlineLabels(
  units: Float64Array,
  cols: PlotlineChunkColumns,
  from: number,
  to: number,
): void {
  const p = [
    cols.true_open,
    cols.true_react,
    cols.true_reply,
    cols.true_save,
    cols.true_reshare,
    cols.true_hide,
  ];
  const y = [cols.open, cols.react, cols.reply, cols.save, cols.reshare, cols.hide];
  for (let i = from; i < to; i++) {
    const m = (i - from) * LABEL_UNITS;
    const shared = units[m];
    // 30 random bits: six 5-bit choices.
    const choices = Math.floor(units[m + 1] * 1073741824);
    for (let k = 0; k < 6; k++) {
      let u: number;
      if (((choices >>> (5 * k)) & 31) < SHARED_IN_32[k]) u = MIRRORED[k] ? 1 - shared : shared;
      else u = units[m + 2 + k];
      y[k][i] = u < p[k][i] ? 1 : 0;
    }
  }
}
