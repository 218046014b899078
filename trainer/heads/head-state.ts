import type { HeadSetup } from "./head-setup.js";
import { ProgressiveStats } from "./progressive-stats.js";
import { sharedFloat64 } from "./shared-float64.js";
import { resolveHeadStateInfo, type HeadStateInfo } from "./resolve-head-state-info.js";

/** Coordinates per page of `writtenPages` (2^9). */
export const COORDINATE_PAGE_SHIFT = 9;

/**
 * The learning state of every head of a model: FTRL-Proximal's z and n per
 * coordinate, what it was learned under, the rows and time window it has seen,
 * and its progressive-validation sums.
 *
 * z and n are laid out [coordinate][head] so that the heads of one coordinate sit
 * in one or two cache lines: a row touches ~110 scattered coordinates, and one
 * miss then serves every head. Coordinate `indexSize` is the bias. Both arrays
 * live on a SharedArrayBuffer so worker threads can update them in place.
 *
 * @example
 * const state = HeadState.create(setup);
 * state.z[coordinate * state.headCount + head];
 */
export class HeadState {
  readonly info: HeadStateInfo;
  readonly z: Float64Array;
  readonly n: Float64Array;
  readonly progressive: ProgressiveStats;
  /**
   * Per page of 2^COORDINATE_PAGE_SHIFT coordinates, 1 where z or n may be
   * non-zero. Copies into and out of the WebAssembly kernel's layout skip the
   * other pages: on some machines first touching a page of memory costs tens of
   * microseconds, so copying a 100 MB state that is mostly zero costs seconds.
   * Whatever writes z or n must mark the pages (the decoder and the merges do).
   */
  readonly writtenPages: Uint8Array;
  /**
   * Under info.averaging: the exponential moving average of every weight,
   * [coordinate][head] like z, as of the last snapshot (see weight-average.ts);
   * null otherwise. Zero on pages never written.
   */
  readonly average: Float64Array | null;
  /** The share of the average's total weight the snapshots so far hold: 1 - 2^(-rows averaged / half-life). */
  averageMass = 0;
  /** Rows seen by every run of this state; also numbers the rows for downsampling. */
  rowCount = 0;
  /** Earliest and latest row timestamp seen (ms since the Unix epoch), null before any. */
  firstTimestamp: number | null = null;
  lastTimestamp: number | null = null;

  constructor(info: HeadStateInfo) {
    this.info = info;
    const length = (info.indexSize + 1) * info.outcomes.length;
    this.z = sharedFloat64(length);
    this.n = sharedFloat64(length);
    this.average = info.averaging === null ? null : sharedFloat64(length);
    this.progressive = new ProgressiveStats(info.outcomes.length, info.sliceHours);
    // Shared: worker threads read it when they fold weights into the average.
    this.writtenPages = new Uint8Array(
      new SharedArrayBuffer(Math.ceil((info.indexSize + 1) / 2 ** COORDINATE_PAGE_SHIFT)),
    );
  }

  /** A fresh state (all weights zero) for a checked setup. */
  static create(setup: HeadSetup): HeadState {
    return new HeadState(resolveHeadStateInfo(setup));
  }

  get headCount(): number {
    return this.info.outcomes.length;
  }

  /** Encoded index space plus the bias coordinate. */
  get coordinateCount(): number {
    return this.info.indexSize + 1;
  }

  get biasCoordinate(): number {
    return this.info.indexSize;
  }
}
