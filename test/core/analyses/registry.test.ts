import { describe, expect, test } from "vitest";
import { analysisModel, analysisModels, isSimulating } from "@onset/core";
import { analysisOptions } from "@onset/netlist-parser";

describe("the analysis registries", () => {
  test("each model is listed under its own keyword", () => {
    for (const [key, model] of Object.entries(analysisModels)) expect(model.keyword).toBe(key);
  });

  test("the language reads each model's options, and the studies' own", () => {
    for (const [key, model] of Object.entries(analysisModels)) expect(analysisOptions[key as keyof typeof analysisOptions]).toBe(model.options);
    expect(Object.keys(analysisOptions)).toEqual([...Object.keys(analysisModels), "sweep", "tolerance"]);
  });

  test("analysisModel(keyword) finds a listed analysis only; studies and inherited names are not simulating", () => {
    expect(analysisModel("startup")).toBe(analysisModels.startup);
    for (const word of ["sweep", "tolerance", "spec", "toString", "constructor", "__proto__"]) expect(analysisModel(word)).toBeUndefined();
    expect(isSimulating({ kind: "sweep", target: "R", from: 1, to: 2, log: false })).toBe(false);
    expect(isSimulating({ kind: "poles" })).toBe(true);
  });
});
