import { describe, expect, test } from "vitest";
import { analysisModels } from "@onset/core";
import { analysisWriters } from "../../../packages/cli/src/analyses/registry.js";
import { hasCsv } from "../../../packages/cli/src/csv/plain.js";
import { hasFigure } from "../../../packages/cli/src/svg/plain.js";

describe("the CLI's analysis writers", () => {
  test("there are writers for exactly the kinds core lists, in its order", () => {
    expect(Object.keys(analysisWriters)).toEqual(Object.keys(analysisModels));
  });

  test("bias and poles are tables (no figure); every analysis writes a CSV", () => {
    const kinds = Object.keys(analysisModels) as (keyof typeof analysisModels)[];
    expect(kinds.filter(hasFigure)).toEqual(["transient", "startup", "steady", "response"]);
    expect(kinds.filter(hasCsv)).toEqual(kinds);
  });
});
