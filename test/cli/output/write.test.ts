import { chmodSync, closeSync, linkSync, lstatSync, mkdtempSync, openSync, readdirSync, readFileSync, rmSync, statSync, symlinkSync, writeFileSync, writeSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, test } from "vitest";
import { CliError } from "../../../packages/cli/src/cli-error.js";
import { outputTarget } from "../../../packages/cli/src/output/target.js";
import { openOutput, writeOutput } from "../../../packages/cli/src/output/write.js";
import { mkfifo, mknodNull, readFifo } from "../../support/special-files.js";

const dir = mkdtempSync(join(tmpdir(), "onset-write-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const at = (name: string) => join(dir, name);
const target = (name: string) => outputTarget(name, dir, "--csv");
const noStdout = (text: string) => {
  throw new Error(`unexpected stdout: ${text}`);
};
/** A document bigger than a pipe's buffer (64 KiB on Linux), so a stream takes it in several writes. */
const BIG = Array.from({ length: 20000 }, (_, k) => `${k},${(k * 0.001).toFixed(3)}\n`).join("");

describe("writeOutput(target, text, stdout): files", () => {
  test("a new file gets the text, and no temporary file is left beside it", () => {
    writeOutput(target("new.csv"), "a,b\n", noStdout);
    expect(readFileSync(at("new.csv"), "utf8")).toBe("a,b\n");
    expect(readdirSync(dir).filter((f) => f.endsWith(".tmp"))).toEqual([]);
  });

  test("a regular file is replaced by a new one (a reader holding the old one keeps it whole) with the old mode", () => {
    writeFileSync(at("kept.csv"), "old");
    chmodSync(at("kept.csv"), 0o640);
    const before = statSync(at("kept.csv"));
    writeOutput(target("kept.csv"), "new", noStdout);
    const after = statSync(at("kept.csv"));
    expect(readFileSync(at("kept.csv"), "utf8")).toBe("new");
    expect(after.ino).not.toBe(before.ino);
    expect(after.mode & 0o7777).toBe(0o640);
    expect(after.uid).toBe(before.uid);
  });

  test("through a symlink the real file is replaced and the link stays a link", () => {
    writeFileSync(at("real.csv"), "old");
    symlinkSync("real.csv", at("link.csv"));
    writeOutput(target("link.csv"), "new", noStdout);
    expect(lstatSync(at("link.csv")).isSymbolicLink()).toBe(true);
    expect(readFileSync(at("real.csv"), "utf8")).toBe("new");
  });

  test("through a dangling symlink its target is created and the link then reads it", () => {
    symlinkSync("made-by-link.csv", at("dangling.csv"));
    writeOutput(target("dangling.csv"), "made", noStdout);
    expect(lstatSync(at("dangling.csv")).isSymbolicLink()).toBe(true);
    expect(readFileSync(at("dangling.csv"), "utf8")).toBe("made");
  });

  test("a file with two hard links is rewritten in place: both names see the new text", () => {
    writeFileSync(at("hard-1.csv"), "a much longer old text than the new one");
    linkSync(at("hard-1.csv"), at("hard-2.csv"));
    writeOutput(target("hard-1.csv"), "new", noStdout);
    expect(readFileSync(at("hard-2.csv"), "utf8")).toBe("new");
    expect(statSync(at("hard-1.csv")).ino).toBe(statSync(at("hard-2.csv")).ino);
  });
});

describe("writeOutput(target, text, stdout): streams", () => {
  test("- goes to the stdout writer", () => {
    const seen: string[] = [];
    writeOutput(outputTarget("-", dir, "--csv"), "x,y\n", (t) => seen.push(t));
    expect(seen).toEqual(["x,y\n"]);
  });

  test("a FIFO with a reader gets the whole document (larger than a pipe holds) and stays a FIFO", async () => {
    mkfifo(at("fifo"));
    const reader = readFifo(at("fifo"), at("fifo.out"));
    writeOutput(target("fifo"), BIG, noStdout);
    expect(await reader).toBe(0);
    expect(readFileSync(at("fifo.out"), "utf8")).toBe(BIG);
    expect(lstatSync(at("fifo")).isFIFO()).toBe(true);
  });

  const canMknod = mknodNull(at("null-node"));
  test.skipIf(!canMknod)("a character device of our own (a null node made with mknod) is written and is still that device (skipped only where mknod is not permitted)", () => {
    const before = lstatSync(at("null-node"));
    writeOutput(target("null-node"), BIG, noStdout);
    const after = lstatSync(at("null-node"));
    expect(after.isCharacterDevice()).toBe(true);
    expect([after.ino, after.rdev]).toEqual([before.ino, before.rdev]);
  });

  test("/dev/fd/N is written through the open descriptor: neither reopened nor truncated", () => {
    const fd = openSync(at("through-fd.txt"), "w");
    try {
      writeSync(fd, "before;");
      writeOutput(outputTarget(`/dev/fd/${fd}`, dir, "--svg"), "document", noStdout);
      writeSync(fd, ";after");
    } finally {
      closeSync(fd);
    }
    expect(readFileSync(at("through-fd.txt"), "utf8")).toBe("before;document;after");
  });

  test("a FIFO whose reader goes away: a plain write failure (exit status 2), not an internal error", async () => {
    rmSync(at("fifo"), { force: true });
    mkfifo(at("fifo"));
    const reader = readFifo(at("fifo"), at("fifo.head"), 10);
    let caught: unknown;
    try {
      writeOutput(target("fifo"), BIG.repeat(4), noStdout);
    } catch (error) {
      caught = error;
    }
    await reader;
    expect(caught).toBeInstanceOf(CliError);
    const d = (caught as CliError).diagnostics[0]!;
    expect([d.code, d.stage, d.message]).toEqual(["write-failed", "input", "cannot write --csv 'fifo': the program reading it went away before onset finished writing (EPIPE)"]);
  });
});

describe("openOutput(target, first, stdout): an output that grows", () => {
  test("a file starts with the first text (replacing the old file), then takes appends", () => {
    writeFileSync(at("grow.jsonl"), "stale\nstale\n");
    const out = openOutput(target("grow.jsonl"), "head\n", noStdout);
    out.append("one\n");
    out.append("two\n");
    out.close();
    expect(readFileSync(at("grow.jsonl"), "utf8")).toBe("head\none\ntwo\n");
    expect(() => out.append("late\n")).toThrow(/append after close/);
  });

  test("a FIFO takes the first text and every append as one stream", async () => {
    rmSync(at("fifo"), { force: true });
    mkfifo(at("fifo"));
    const reader = readFifo(at("fifo"), at("grow.out"));
    const out = openOutput(target("fifo"), "head\n", noStdout);
    out.append(BIG);
    out.append("tail\n");
    out.close();
    expect(await reader).toBe(0);
    expect(readFileSync(at("grow.out"), "utf8")).toBe(`head\n${BIG}tail\n`);
  });

  test("- sends the first text and the appends to the stdout writer", () => {
    const seen: string[] = [];
    const out = openOutput(outputTarget("-", dir, "--results"), "h\n", (t) => seen.push(t));
    out.append("s\n");
    out.close();
    expect(seen).toEqual(["h\n", "s\n"]);
  });
});
