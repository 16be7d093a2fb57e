import { describe, expect, test } from "vitest";
import { pairs, table } from "../../../packages/cli/src/report/table.js";
import { numberedPath } from "../../../packages/cli/src/output-files.js";

describe("table(columns, rows)", () => {
  test("pads every column to its widest cell, numbers on the right, colour codes taking no room", () => {
    const lines = table(
      [{ header: "node" }, { header: "voltage", align: "right" }],
      [
        ["o", "4.73 V"],
        ["N1.mid", "\u001b[32m12 mV\u001b[39m"],
      ],
    );
    expect(lines).toEqual(["  node    voltage", "  o        4.73 V", "  N1.mid    \u001b[32m12 mV\u001b[39m"]);
  });

  test("pairs line their values up after the longest label", () => {
    expect(pairs([["frequency", "1 kHz"], ["THD", "1 %"]])).toEqual(["  frequency  1 kHz", "  THD        1 %"]);
  });
});

describe("numberedPath(path, k)", () => {
  test("the first file keeps its name, later ones are numbered from 2 before the extension", () => {
    expect([0, 1, 2].map((k) => numberedPath("out/plot.svg", k))).toEqual(["out/plot.svg", "out/plot-2.svg", "out/plot-3.svg"]);
    expect(numberedPath("data", 1)).toBe("data-2");
  });
});
