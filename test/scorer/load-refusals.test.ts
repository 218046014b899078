import { describe, expect, it } from "vitest";
import type { ScorerArtifact } from "../../scorer/artifact.generated.js";
import { artifactChecksum } from "../../scorer/artifact-checksum.js";
import { loadScorer } from "../../scorer/load-scorer.js";
import { ScorerError } from "../../scorer/scorer-error.js";
import { buildArtifact } from "../../trainer/artifact/build-artifact.js";
import { formatArtifactText } from "../../trainer/artifact/format-artifact-text.js";
import { smallModel } from "./fixtures.js";

const artifact = buildArtifact({
  ...smallModel(),
  provenance: { name: "plotline-small", createdAt: new Date("2025-03-01T06:00:00Z") },
});
const text = formatArtifactText(artifact);

/** A deep copy to damage. */
function copy(): ScorerArtifact {
  return JSON.parse(text) as ScorerArtifact;
}

/** Damages a copy and re-seals its checksum, as a careless (or hostile) editor would, so the checks behind the checksum must catch it. */
function resealed(damage: (doc: ScorerArtifact) => void): ScorerArtifact {
  const doc = copy();
  damage(doc);
  doc.checksum = artifactChecksum(doc);
  return doc;
}

function refusal(input: unknown): ScorerError {
  try {
    loadScorer(input);
  } catch (error) {
    expect(error).toBeInstanceOf(ScorerError);
    return error as ScorerError;
  }
  throw new Error("expected the artifact to be refused, but it loaded");
}

describe("loadScorer refuses damaged artifacts with a clear error", () => {
  it("loads the intact artifact from text and from the parsed document", () => {
    expect(loadScorer(text).outcomes).toEqual([
      "open",
      "react",
      "reply",
      "save",
      "reshare",
      "hide",
    ]);
    expect(loadScorer(copy()).outcomes.length).toBe(6);
  });

  it("a flipped digit in a number: checksum mismatch", () => {
    const at = text.indexOf('"leafValue": [') + '"leafValue": ['.length;
    const digit = text.slice(at).search(/[1-9]/) + at;
    const flipped =
      text.slice(0, digit) +
      (text[digit] === "9" ? "8" : String(Number(text[digit]) + 1)) +
      text.slice(digit + 1);
    const error = refusal(flipped);
    expect(error.code).toBe("checksum");
    expect(error.path).toBe("/checksum");
    expect(error.message).toMatch(
      /^artifact: \/checksum: expected sha256:[0-9a-f]{64} \(computed over the content\), found sha256:/,
    );
  });

  it("a wrong checksum", () => {
    const doc = copy();
    doc.checksum = `sha256:${"0".repeat(64)}`;
    expect(refusal(doc).code).toBe("checksum");
    doc.checksum = "md5:abc";
    const error = refusal(doc);
    expect(error.code).toBe("pattern");
    expect(error.path).toBe("/checksum");
  });

  it("a removed field", () => {
    const doc = copy() as Partial<ScorerArtifact>;
    delete doc.heads;
    const error = refusal(doc);
    expect(error.code).toBe("required");
    expect(error.message).toContain('required field "heads" is missing');
    const noThreshold = copy() as unknown as { forests: { threshold?: unknown }[] };
    delete noThreshold.forests[0].threshold;
    expect(refusal(noThreshold).path).toBe("/forests/0/threshold");
  });

  it("a wrong version or format", () => {
    const doc = copy() as unknown as { formatVersion: number; format: string };
    doc.formatVersion = 2;
    let error = refusal(doc);
    expect(error.code).toBe("version");
    expect(error.message).toBe(
      "artifact: /formatVersion: expected format version 1 (the only version this runtime reads), found 2",
    );
    doc.formatVersion = 1;
    doc.format = "some-other-model";
    error = refusal(doc);
    expect(error.code).toBe("format");
    expect(refusal({}).code).toBe("format");
    expect(refusal([1, 2]).code).toBe("not_an_object");
    expect(refusal("{ not json").code).toBe("invalid_json");
  });

  it("NaN smuggled in as a string or null where a number belongs", () => {
    for (const bad of ["NaN", null, "Infinity", "1e999"]) {
      const doc = resealed((d) => {
        (d.forests[0].threshold as unknown[])[5] = bad;
      });
      const error = refusal(doc);
      expect(error.code).toBe("type");
      expect(error.path).toBe("/forests/0/threshold/5");
      expect(error.message).toContain(
        `expected number, found ${bad === null ? "null" : JSON.stringify(bad)}`,
      );
    }
    // 1e999 in the text parses to Infinity, which no JSON number slot accepts.
    const huge = text.replace(/"bias": [^,]+,/, '"bias": 1e999,');
    expect(refusal(huge).path).toBe("/heads/0/bias");
  });

  it("out-of-range indexes, caught behind a valid checksum", () => {
    let error = refusal(resealed((d) => (d.forests[0].feature[17] = 99)));
    expect(error.code).toBe("out_of_range");
    expect(error.path).toBe("/forests/0/feature/17");
    expect(error.message).toContain("expected a feature index in [-1, 17), found 99");

    const width = 20 * 16 + 2 ** 10 + 2;
    error = refusal(
      resealed((d) => {
        d.heads[2].indexDelta.push(width);
        d.heads[2].weight.push(0.5);
      }),
    );
    expect(error.code).toBe("out_of_range");
    expect(error.path).toBe(
      `/heads/2/indexDelta/${(JSON.parse(text) as ScorerArtifact).heads[2].indexDelta.length}`,
    );
    error = refusal(resealed((d) => (d.heads[1].indexDelta[0] = width + 5)));
    expect(error.path).toBe("/heads/1/indexDelta/0");
    expect(error.message).toContain(
      `expected an encoded index in [0, ${width}), found ${width + 5}`,
    );

    error = refusal(resealed((d) => (d.heads[0].indexDelta[4] = 0)));
    expect(error.code).toBe("not_ascending");
    expect(error.path).toBe("/heads/0/indexDelta/4");

    error = refusal(resealed((d) => d.forests[0].leafValue.pop()));
    expect(error.code).toBe("length");
    expect(error.message).toContain("expected 320 entries (20 trees of depth 4), found 319");

    error = refusal(resealed((d) => d.forests[0].categorySplits.push(0, 1, 2)));
    expect(["not_categorical", "duplicate"]).toContain(error.code);

    const categorical = resealed((d) => {
      const runs = d.forests[0].categorySplits;
      runs[2] = 500; // a code past the feature's values
    });
    error = refusal(categorical);
    expect(error.code).toBe("out_of_range");
    expect(error.path).toBe("/forests/0/categorySplits");

    error = refusal(resealed((d) => (d.contract.hashing.columns[0] = "no_such_column")));
    expect(error.code).toBe("unknown_feature");
    expect(error.path).toBe("/contract/hashing/columns/0");

    error = refusal(resealed((d) => (d.contract.standardized[0].std = 0)));
    expect(error.path).toBe("/contract/standardized/0/std");
  });

  it("lists several problems at once, each with its path", () => {
    const error = refusal(
      resealed((d) => {
        d.forests[0].feature[3] = 1000;
        d.heads[0].negativeKeepRate = 0;
      }),
    );
    expect(error.issues.map((issue) => issue.path)).toEqual(["/heads/0/negativeKeepRate"]);
    const both = refusal(
      resealed((d) => {
        d.forests[0].depth = 4;
        d.heads[0].weight.pop();
        d.heads[3].indexDelta[0] = 1e20;
      }),
    );
    expect(both.issues.length).toBeGreaterThanOrEqual(2);
    expect(both.message.split("\n").length).toBe(both.issues.length);
  });
});
