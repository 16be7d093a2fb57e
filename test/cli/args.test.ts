import { describe, expect, test } from "vitest";
import { parseArgs, valueOf, type OptionSpec } from "../../packages/cli/src/args.js";
import { CliError } from "../../packages/cli/src/cli-error.js";

const options: OptionSpec[] = [
  { name: "json", summary: "" },
  { name: "csv", value: "FILE", summary: "" },
  { name: "set", value: "NAME=VALUE", repeat: true, summary: "" },
  { name: "quiet", short: "q", summary: "" },
];

function problem(argv: string[]): string {
  try {
    parseArgs(argv, options, "run");
  } catch (e) {
    if (e instanceof CliError) return e.diagnostics[0]!.message;
    throw e;
  }
  return "no error";
}

describe("parseArgs(argv, options, command)", () => {
  test("reads flags, values after a space or =, repeated values and positionals in any order", () => {
    const a = parseArgs(["x.onset", "--json", "--csv", "a.csv", "--set", "R=1k", "-q", "--set=C=2n", "--csv=b.csv"], options, "run");
    expect(a.positionals).toEqual(["x.onset"]);
    expect([...a.flags].sort()).toEqual(["json", "quiet"]);
    expect(valueOf(a, "csv")).toBe("b.csv");
    expect(a.values.get("set")).toEqual(["R=1k", "C=2n"]);
  });

  test("a lone - is standard input and -- ends the options", () => {
    expect(parseArgs(["-", "--", "--json"], options, "run").positionals).toEqual(["-", "--json"]);
  });

  test("unknown options, missing values and values on flags are usage errors with the exact message", () => {
    expect(problem(["--jsn"])).toBe("run: unknown option '--jsn' (did you mean '--json'?)");
    expect(problem(["--csv"])).toBe("run: --csv needs a value");
    expect(problem(["--csv", "--json"])).toBe("run: --csv needs a value");
    expect(problem(["--json=yes"])).toBe("run: --json takes no value");
    expect(problem(["-x"])).toBe("run: unknown option '-x'");
    expect(problem(["-json"])).toBe("run: unknown option '-json' (did you mean '--json'?)");
    expect(problem(["-jsn"])).toBe("run: unknown option '-jsn' (did you mean '--json'?)");
  });
});
