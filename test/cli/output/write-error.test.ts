import { describe, expect, test } from "vitest";
import { CliError } from "../../../packages/cli/src/cli-error.js";
import { errnoReason, writeFailure } from "../../../packages/cli/src/output/write-error.js";

/** A system error as node raises it: a code and the call that failed. */
function systemError(code: string, syscall = "write"): NodeJS.ErrnoException {
  return Object.assign(new Error(`${code}: ${syscall}`), { code, syscall });
}

describe("writeFailure(error, label, shown)", () => {
  test.each([
    ["ENOSPC", "no space left on the device (ENOSPC)", "free some space, or write elsewhere"],
    ["EPIPE", "the program reading it went away before onset finished writing (EPIPE)", "keep the reading program open until onset exits"],
    ["EROFS", "the file system is read-only (EROFS)", undefined],
    ["EACCES", "permission denied (EACCES)", undefined],
  ])("%s becomes a plain message naming the option and the path (exit status 2)", (code, reason, hint) => {
    const mapped = writeFailure(systemError(code), "--csv", "out.csv");
    expect(mapped).toBeInstanceOf(CliError);
    const d = (mapped as CliError).diagnostics[0]!;
    expect(d).toEqual({ severity: "error", stage: "input", code: "write-failed", message: `cannot write --csv 'out.csv': ${reason}`, ...(hint === undefined ? {} : { hint }) });
  });

  test("an error that is not the system's (a bug) is passed on unchanged", () => {
    const bug = new TypeError("x is undefined");
    expect(writeFailure(bug, "--csv", "out.csv")).toBe(bug);
  });

  test("an unknown code keeps the system's own message", () => {
    expect(errnoReason(systemError("EWEIRD"))).toBe("EWEIRD: write");
  });
});
