import { describe, expect, it } from "vitest";
import { parseIsoTime } from "../../trainer/data/parse-iso-time.js";

describe("parseIsoTime", () => {
  it("reads ISO 8601 dates and date-times as epoch milliseconds (oracle: Date.parse with an explicit zone)", () => {
    const cases = [
      "2024-05-01T10:00:00Z",
      "2024-05-01T10:00:00.123Z",
      "2024-05-01T10:00:00+02:00",
      "2024-05-01T10:00:00-05:30",
      "1969-12-31T23:59:59Z",
      "2000-02-29T00:00:00Z",
    ];
    for (const text of cases) expect(parseIsoTime(text), text).toBe(Date.parse(text));
    // Without a zone: UTC on every machine (Date.parse would use the local zone).
    expect(parseIsoTime("2024-05-01T10:00:00")).toBe(Date.parse("2024-05-01T10:00:00Z"));
    expect(parseIsoTime("2024-05-01 10:00")).toBe(Date.parse("2024-05-01T10:00:00Z"));
    expect(parseIsoTime("2024-05-01")).toBe(Date.parse("2024-05-01T00:00:00Z"));
    expect(parseIsoTime("2024-05-01T10:00:00.123456789Z")).toBe(
      Date.parse("2024-05-01T10:00:00.123Z"),
    );
    expect(parseIsoTime("0050-01-01T00:00:00Z")).toBe(Date.parse("0050-01-01T00:00:00Z"));
  });

  it("refuses impossible dates and other text", () => {
    for (const text of [
      "2024-02-30",
      "2023-02-29",
      "2024-13-01",
      "2024-05-01T24:00:00Z",
      "2024-05-01T10:60",
      "1714557600",
      "May 1 2024",
      "",
      "2024-05-01T10:00:00+25:00",
    ]) {
      expect(parseIsoTime(text), text).toBeNaN();
    }
  });
});
