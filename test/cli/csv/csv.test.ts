import { describe, expect, test } from "vitest";
import { csvDocument, csvField, csvNumber } from "../../../packages/cli/src/csv/csv.js";

describe("CSV cells (RFC 4180)", () => {
  test("quotes a field holding a comma, a quote or a line break, doubling quotes", () => {
    expect(csvField("o-ref")).toBe("o-ref");
    expect(csvField('a,"b"')).toBe('"a,""b"""');
  });

  test("numbers read back to the same double; missing and non-finite values are empty", () => {
    for (const x of [0.1 + 0.2, 1e-300, -4.7e3, 5e-4]) expect(Number(csvNumber(x))).toBe(x);
    expect([csvNumber(null), csvNumber(NaN), csvNumber(Infinity)]).toEqual(["", "", ""]);
  });

  test("a document is the header row then the rows, each ended by a newline", () => {
    expect(csvDocument(["time", "o"], [["0", "1"]])).toBe("time,o\n0,1\n");
  });
});
