import { mkdirSync, mkdtempSync, rmSync, symlinkSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, test } from "vitest";
import { elaborate, loadProgram, SourceError } from "@onset/netlist-parser";
import { fileReader, readRegularFile, readSource } from "@onset/netlist-parser/node";
import { mkfifo, mknod } from "../../support/special-files.js";

const root = mkdtempSync(join(tmpdir(), "onset-reader-"));
const project = join(root, "project");
mkdirSync(join(project, "lib"), { recursive: true });
mkdirSync(join(root, "shared"));
writeFileSync(join(project, "main.onset"), 'include "lib/parts.onset"\nvsource V1 a gnd 5\nresistor R1 a gnd (R)\nbias\n');
writeFileSync(join(project, "lib/parts.onset"), 'include "../values.onset"\n');
writeFileSync(join(project, "values.onset"), "param R = 10k\n");
writeFileSync(join(root, "shared/secret.onset"), "param S = 1\n");
writeFileSync(join(root, "outside.onset"), "param O = 1\n");
symlinkSync(join(root, "shared"), join(project, "link-out"));
mkfifo(join(project, "pipe.onset"));
const zero = mknod(join(project, "zero.onset"), "c", 1, 5);
afterAll(() => rmSync(root, { recursive: true, force: true }));

/** The problems of loading `text` as project/main.onset with the reader confined to the project. */
function problems(text: string, options: Parameters<typeof fileReader>[0] = {}): string[] {
  const reader = fileReader({ cwd: project, roots: [project], ...options });
  return loadProgram("main.onset", text, reader).diagnostics.map((d) => `${d.code}: ${d.message} @${d.span?.start}-${d.span?.end}`);
}

describe("fileReader (the file-system include reader)", () => {
  test("follows includes relative to each including file, inside the allowed tree", () => {
    const source = readSource(join(project, "main.onset"), { cwd: root });
    expect([...source.sources.keys()]).toEqual(["project/main.onset", "project/lib/parts.onset", "project/values.onset"]);
    expect(elaborate(source.program).circuit?.parts.map((p) => p.value)).toEqual([5, 10e3]);
  });

  test("an include outside the tree is refused by the path as written, without reading it", () => {
    expect(problems('include "../outside.onset"\n')).toEqual(["include-outside: '../outside.onset' is outside the folders includes may read (.) @8-26"]);
    expect(problems('include "/etc/hostname"\n')).toEqual(["include-outside: '/etc/hostname' is outside the folders includes may read (.) @8-23"]);
  });

  test("a link inside the tree that leads outside it is refused too", () => {
    expect(problems('include "link-out/secret.onset"\n')).toEqual(["include-outside: 'link-out/secret.onset' is outside the folders includes may read (.) @8-31"]);
  });

  test("roots let includes read more, and anywhere reads any file", () => {
    expect(problems('include "link-out/secret.onset"\n', { roots: [project, join(root, "shared")] })).toEqual([]);
    expect(problems('include "../outside.onset"\n', { anywhere: true })).toEqual([]);
  });

  test("a FIFO, a folder and a device are refused by kind before they are opened (a FIFO open would wait for a writer)", () => {
    expect(problems('include "pipe.onset"\n')).toEqual(["not-a-regular-file: 'pipe.onset' is a FIFO (named pipe), not a regular file: circuit files are read only from regular files @8-20"]);
    expect(problems('include "lib"\n')).toEqual(["not-a-regular-file: 'lib' is a folder, not a regular file: circuit files are read only from regular files @8-13"]);
    if (zero) expect(problems('include "zero.onset"\n')).toEqual(["not-a-regular-file: 'zero.onset' is a character device, not a regular file: circuit files are read only from regular files @8-20"]);
    expect(problems('include "/dev/zero"\n', { anywhere: true })).toEqual(["not-a-regular-file: '/dev/zero' is a character device, not a regular file: circuit files are read only from regular files @8-19"]);
  });

  test("a missing file is include-missing", () => {
    expect(problems('include "nope.onset"\n')).toEqual(["include-missing: cannot find included file 'nope.onset' @8-20"]);
  });

  test("a file above the size limit is refused by its size before it is read", () => {
    writeFileSync(join(project, "big.onset"), `# ${"x".repeat(5000)}\n`);
    const reader = fileReader({ cwd: project });
    const r = loadProgram("main.onset", 'include "big.onset"\n', reader, { maxSourceBytes: 4096 });
    expect(r.diagnostics.map((d) => [d.code, d.message, d.hint])).toEqual([
      ["source-too-large", "'big.onset' is 5 kB (5003 bytes), above the source-file size limit of 4.1 kB", "raise the limit with --limit source-size=10M (API: limits.maxSourceBytes)"],
    ]);
  });
});

describe("readRegularFile", () => {
  test("reads at most the limit, whatever the size", () => {
    writeFileSync(join(project, "exact.onset"), "abcdef");
    expect(readRegularFile(join(project, "exact.onset"), 6)).toBe("abcdef");
    expect(() => readRegularFile(join(project, "exact.onset"), 5)).toThrow("is 6 bytes, above the source-file size limit of 5 bytes");
    expect(readRegularFile(join(project, "none.onset"), 5)).toBeUndefined();
  });
});

describe("readSource", () => {
  test("a missing or refused top file is a SourceError, like any other problem", () => {
    expect(() => readSource(join(project, "nope.onset"))).toThrow(SourceError);
    let error: unknown;
    try {
      readSource(join(project, "pipe.onset"), { cwd: project });
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(SourceError);
    expect((error as SourceError).diagnostic.code).toBe("not-a-regular-file");
  });

  test("includes may read the top file's folder tree by default, and not beyond", () => {
    writeFileSync(join(project, "lib/up.onset"), 'include "../../outside.onset"\n');
    expect(() => readSource(join(project, "lib/up.onset"), { cwd: root })).toThrow("'../../outside.onset' is outside the folders includes may read (project/lib)");
    expect(readSource(join(project, "lib/up.onset"), { cwd: root, roots: [root] }).sources.size).toBe(2);
  });
});
