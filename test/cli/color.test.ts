import { describe, expect, test } from "vitest";
import { colorWanted, paint } from "../../packages/cli/src/color.js";
import type { CliIo } from "../../packages/cli/src/io.js";

const io = (env: Record<string, string>): CliIo => ({
  stdout: () => undefined,
  stderr: () => undefined,
  readStdin: () => "",
  stdoutIsTerminal: true,
  stderrIsTerminal: true,
  env,
  cwd: "/",
});

describe("colorWanted(io, noColor, isTerminal)", () => {
  test("colour only on a terminal, never with --no-color or a non-empty NO_COLOR (no-color.org)", () => {
    expect(colorWanted(io({}), false, true)).toBe(true);
    expect(colorWanted(io({}), false, false)).toBe(false);
    expect(colorWanted(io({}), true, true)).toBe(false);
    expect(colorWanted(io({ NO_COLOR: "1" }), false, true)).toBe(false);
    expect(colorWanted(io({ NO_COLOR: "" }), false, true)).toBe(true);
  });

  test("without colour the paint functions return the text unchanged", () => {
    expect(paint(false).red("FAIL")).toBe("FAIL");
    expect(paint(true).red("FAIL")).not.toBe("FAIL");
  });
});
