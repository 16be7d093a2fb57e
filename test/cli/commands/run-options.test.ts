import { describe, expect, test } from "vitest";
import { parseArgs } from "../../../packages/cli/src/args.js";
import { CliError } from "../../../packages/cli/src/cli-error.js";
import { COMMANDS } from "../../../packages/cli/src/commands/table.js";
import { overridesOf, shardOf } from "../../../packages/cli/src/commands/run-options.js";

const run = COMMANDS.find((c) => c.name === "run")!;
const args = (...words: string[]) => parseArgs(["x.onset", ...words], run.options, "run");

function message(work: () => unknown): string {
  try {
    work();
  } catch (e) {
    if (e instanceof CliError) return e.diagnostics[0]!.message;
    throw e;
  }
  return "no error";
}

describe("shardOf(args, env)", () => {
  test("k/n and env:NAME/n give the 0-based shard", () => {
    expect(shardOf(args("--shard", "2/5"), {})).toEqual({ index: 2, count: 5 });
    expect(shardOf(args("--shard", "env:TASK/4"), { TASK: "3" })).toEqual({ index: 3, count: 4 });
    expect(shardOf(args(), {})).toBeNull();
  });

  test("an index outside 0 … n − 1, a missing variable or a malformed slice is refused", () => {
    expect(message(() => shardOf(args("--shard", "4/4"), {}))).toBe("--shard 4/4: index 4 is not below the count 4");
    expect(message(() => shardOf(args("--shard", "env:TASK/4"), {}))).toBe("--shard env:TASK/4: the environment variable TASK is not set");
    expect(message(() => shardOf(args("--shard", "1-4"), {}))).toBe("--shard '1-4' is not k/n or env:NAME/n");
    expect(message(() => shardOf(args("--shard", "0/0"), {}))).toBe("the shard count '0' must be a whole number of at least 1");
  });
});

describe("overridesOf(args)", () => {
  test("NAME=VALUE pairs, the last one for a name winning", () => {
    expect(overridesOf(args("--set", "R=10k", "--set", "P1.at=0.4", "--set", "R=11k"))).toEqual({ R: "11k", "P1.at": "0.4" });
  });

  test("a pair without a name or a value is refused", () => {
    expect(message(() => overridesOf(args("--set", "R")))).toBe("--set 'R' is not NAME=VALUE");
    expect(message(() => overridesOf(args("--set", "=3")))).toBe("--set '=3' is not NAME=VALUE");
  });
});
