import { LeafcastError, type Issue } from "../errors.js";
import { FRESHNESS_ARM_LABELS, type ReportInput } from "./report-input.js";

/**
 * Checks the parts of a ReportInput that would otherwise draw a wrong chart without a
 * word: indexes out of range, series of the wrong length, duplicate labels that a chart
 * would merge, latency percentiles out of order. Gathers every problem, then throws one
 * LeafcastError ("report"). Non-finite metric figures are allowed: they show as "n/a".
 *
 * @example
 * checkReportInput({ freshness: { windows: ["w1"], figures: [{ outcome: "reply", arm: "frozen", window: 3, ne: 0.9, calibration: 1 }] } });
 * // throws: report: freshness figure 1 (reply, frozen) expected a window index in [0, 1), found 3
 */
export function checkReportInput(input: ReportInput): void {
  const issues: Issue[] = [];
  const add = (code: string, message: string): void => {
    if (issues.length < 50) issues.push({ code, message });
  };

  input.heads?.forEach((head, i) => {
    if (typeof head.outcome !== "string" || head.outcome === "")
      add(
        "outcome_name",
        `head ${i + 1} expected an outcome name, found ${JSON.stringify(head.outcome)}`,
      );
    const r = head.reliability;
    if (
      r !== undefined &&
      (r.meanPredicted.length !== r.count.length || r.observedRate.length !== r.count.length)
    ) {
      add(
        "length_mismatch",
        `head "${head.outcome}" reliability expected count, meanPredicted and observedRate of one length, found ${r.count.length}, ${r.meanPredicted.length} and ${r.observedRate.length}`,
      );
    }
  });

  const fresh = input.freshness;
  if (fresh !== undefined) {
    checkUnique(add, "freshness window", fresh.windows);
    const seen = new Set<string>();
    fresh.figures.forEach((f, i) => {
      const where = `freshness figure ${i + 1} (${f.outcome}, ${f.arm})`;
      if (!Object.hasOwn(FRESHNESS_ARM_LABELS, f.arm))
        add(
          "freshness_arm",
          `${where} expected an arm of ${Object.keys(FRESHNESS_ARM_LABELS).join(", ")}, found "${f.arm}"`,
        );
      if (!(Number.isInteger(f.window) && f.window >= 0 && f.window < fresh.windows.length))
        add(
          "window_index",
          `${where} expected a window index in [0, ${fresh.windows.length}), found ${f.window}`,
        );
      const key = JSON.stringify([f.outcome, f.arm, f.window]);
      if (seen.has(key)) add("duplicate", `${where} repeats window ${f.window}`);
      seen.add(key);
    });
  }

  const stale = input.staleness;
  if (stale !== undefined) {
    checkUnique(add, "staleness window", stale.windows);
    checkUnique(
      add,
      "staleness forest",
      stale.forests.map((f) => f.forest),
    );
    if (stale.threshold !== undefined && !(stale.threshold > 0 && stale.threshold < Infinity))
      add("threshold", `staleness threshold expected a positive number, found ${stale.threshold}`);
    for (const series of stale.forests) {
      if (series.perWindow.length !== stale.windows.length)
        add(
          "length_mismatch",
          `staleness forest "${series.forest}" expected ${stale.windows.length} windows (as the window labels), found ${series.perWindow.length}`,
        );
      const trees = new Set(series.perWindow.map((w) => w.perTree.length));
      if (trees.size > 1)
        add(
          "length_mismatch",
          `staleness forest "${series.forest}" expected one tree count in every window, found ${[...trees].join(", ")}`,
        );
    }
  }

  for (const forest of input.importance ?? []) {
    checkUnique(
      add,
      `importance of forest "${forest.forest}": feature`,
      forest.features.map((f) => f.feature),
    );
  }

  input.pruning?.steps.forEach((step, i) => {
    if (!(Number.isInteger(step.featuresKept) && step.featuresKept >= 0))
      add(
        "features_kept",
        `pruning step ${i + 1} expected a whole number of features kept, found ${step.featuresKept}`,
      );
  });

  const latency = input.latency;
  if (latency !== undefined) {
    const p = latency.perItem;
    const order: [string, number][] = [
      ["p50", p.p50],
      ["p90", p.p90],
      ["p99", p.p99],
      ["p99.9", p.p999],
      ["max", p.max],
    ];
    order.forEach(([name, ns], k) => {
      if (!(ns >= 0 && ns < Infinity))
        add("latency", `latency ${name} expected nanoseconds >= 0, found ${ns}`);
      else if (k > 0 && ns < order[k - 1][1])
        add(
          "latency_order",
          `latency ${name} expected at least ${order[k - 1][0]} (${order[k - 1][1]} ns), found ${ns} ns`,
        );
    });
    for (const b of latency.batches ?? []) {
      if (!(Number.isInteger(b.batchSize) && b.batchSize >= 1))
        add("batch_size", `latency batch size expected a whole number >= 1, found ${b.batchSize}`);
      if (!(b.nsPerItem >= 0 && b.nsPerItem < Infinity))
        add(
          "latency",
          `latency batch of ${b.batchSize} expected nanoseconds per item >= 0, found ${b.nsPerItem}`,
        );
    }
    checkUnique(
      add,
      "latency batch size",
      (latency.batches ?? []).map((b) => String(b.batchSize)),
    );
  }

  if (issues.length > 0) throw new LeafcastError("report", issues);
}

function checkUnique(
  add: (code: string, message: string) => void,
  what: string,
  names: readonly string[],
): void {
  const seen = new Set<string>();
  for (const name of names) {
    if (seen.has(name))
      add("duplicate", `${what} names expected to be unique, found "${name}" twice`);
    seen.add(name);
  }
}
