import { closeSync, linkSync, mkdirSync, mkdtempSync, openSync, readdirSync, readlinkSync, rmSync, symlinkSync, writeFileSync } from "node:fs";
import { createServer, type Server } from "node:net";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, test } from "vitest";
import { CliError } from "../../../packages/cli/src/cli-error.js";
import { descriptorOf, isStream, outputTarget, type OutputTarget } from "../../../packages/cli/src/output/target.js";
import { mkfifo, mknod, mknodNull } from "../../support/special-files.js";

const dir = mkdtempSync(join(tmpdir(), "onset-target-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** The message of the usage error `outputTarget` throws for `given`. */
function refusal(given: string, label = "--csv"): string {
  try {
    outputTarget(given, dir, label);
  } catch (error) {
    expect(error).toBeInstanceOf(CliError);
    const d = (error as CliError).diagnostics[0]!;
    expect(d.stage).toBe("input");
    return `${d.message} | ${d.hint ?? ""}`;
  }
  throw new Error(`outputTarget(${given}) did not refuse`);
}

function kindOf(t: OutputTarget): string {
  return t.kind;
}

describe("descriptorOf(path)", () => {
  test("names the descriptor of /dev/fd/N, /proc/self/fd/N, /proc/<own pid>/fd/N and /dev/std*", () => {
    expect(descriptorOf("/dev/fd/3")).toBe(3);
    expect(descriptorOf("/proc/self/fd/12")).toBe(12);
    expect(descriptorOf(`/proc/${process.pid}/fd/4`)).toBe(4);
    expect(descriptorOf("/dev/stdout")).toBe(1);
    expect(descriptorOf("/dev/stderr")).toBe(2);
  });

  test("is null for other paths, another process's descriptors and non-numbers", () => {
    expect(descriptorOf("/dev/fd")).toBeNull();
    expect(descriptorOf("/dev/fd/x")).toBeNull();
    expect(descriptorOf(`/proc/${process.pid + 1}/fd/4`)).toBeNull();
    expect(descriptorOf("/tmp/dev/fd/3")).toBeNull();
  });
});

describe("outputTarget(given, cwd, label): streams", () => {
  test("- and /dev/stdout are standard output", () => {
    expect(outputTarget("-", dir, "--csv")).toEqual({ kind: "stdout", label: "--csv", shown: "-" });
    expect(kindOf(outputTarget("/dev/stdout", dir, "--csv"))).toBe("stdout");
    expect(kindOf(outputTarget("/dev/fd/1", dir, "--csv"))).toBe("stdout");
  });

  test("/dev/fd/N of an open descriptor is that descriptor, a closed one is refused", () => {
    const fd = openSync(join(dir, "fd-target.txt"), "w");
    try {
      expect(outputTarget(`/dev/fd/${fd}`, dir, "--svg")).toEqual({ kind: "descriptor", label: "--svg", shown: `/dev/fd/${fd}`, fd });
    } finally {
      closeSync(fd);
    }
    expect(refusal("/dev/fd/987")).toBe("cannot write --csv '/dev/fd/987': descriptor 987 is not open | open it in the shell (e.g. 987>file) or give a file name");
  });

  test("a descriptor of the command's own event loop (an epoll or eventfd, neither file nor pipe) is refused", () => {
    const own = readdirSync("/proc/self/fd").find((f) => {
      try {
        return readlinkSync(`/proc/self/fd/${f}`).startsWith("anon_inode:");
      } catch {
        return false;
      }
    });
    expect(own).toBeDefined();
    expect(refusal(`/dev/fd/${own}`)).toBe(`cannot write --csv '/dev/fd/${own}': descriptor ${own} is not a file, a pipe or a terminal opened for onset | open it in the shell (e.g. ${own}>file) or give a file name`);
  });

  test("a FIFO is a device written in place, and so is a link to it", () => {
    mkfifo(join(dir, "pipe"));
    symlinkSync("pipe", join(dir, "pipe-link"));
    expect(outputTarget("pipe", dir, "--csv")).toEqual({ kind: "device", label: "--csv", shown: "pipe", path: join(dir, "pipe"), what: "FIFO" });
    expect(outputTarget("pipe-link", dir, "--csv")).toMatchObject({ kind: "device", path: join(dir, "pipe"), what: "FIFO" });
  });

  const canMknod = mknodNull(join(dir, "null-node"));
  test.skipIf(!canMknod)("a character device (our own null node, made with mknod) is a device written in place (skipped only where mknod is not permitted)", () => {
    expect(outputTarget("null-node", dir, "--csv")).toMatchObject({ kind: "device", what: "character device" });
  });

  test("streams take one document; files do not", () => {
    expect(isStream(outputTarget("-", dir, "--csv"))).toBe(true);
    expect(isStream(outputTarget("pipe", dir, "--csv"))).toBe(true);
    expect(isStream(outputTarget("new.csv", dir, "--csv"))).toBe(false);
  });
});

describe("outputTarget(given, cwd, label): files", () => {
  beforeAll(() => {
    writeFileSync(join(dir, "real.csv"), "old");
    symlinkSync("real.csv", join(dir, "link.csv"));
    symlinkSync("link.csv", join(dir, "link-of-link.csv"));
    mkdirSync(join(dir, "sub"));
    symlinkSync("../real.csv", join(dir, "sub", "up.csv"));
    symlinkSync("sub/missing.csv", join(dir, "dangling.csv"));
    symlinkSync("loop-b", join(dir, "loop-a"));
    symlinkSync("loop-a", join(dir, "loop-b"));
    writeFileSync(join(dir, "linked-1.csv"), "x");
    linkSync(join(dir, "linked-1.csv"), join(dir, "linked-2.csv"));
  });

  test("a new path in an existing folder is a new file, replaced atomically", () => {
    expect(outputTarget("new.csv", dir, "--csv")).toEqual({ kind: "file", label: "--csv", shown: "new.csv", path: join(dir, "new.csv"), existing: null, inPlace: false });
  });

  test("an existing regular file is replaced, and its old state is kept for its mode and owner", () => {
    const t = outputTarget("real.csv", dir, "--csv");
    expect(t).toMatchObject({ kind: "file", path: join(dir, "real.csv"), inPlace: false });
    expect(t.kind === "file" && t.existing?.size).toBe(3);
  });

  test("a symlink (a chain of them, relative to each link's folder) resolves to the real file", () => {
    for (const given of ["link.csv", "link-of-link.csv", "sub/up.csv"]) {
      expect(outputTarget(given, dir, "--csv")).toMatchObject({ kind: "file", shown: given, path: join(dir, "real.csv") });
    }
  });

  test("a dangling symlink names the file to create: its target, so the link then points at it", () => {
    expect(outputTarget("dangling.csv", dir, "--csv")).toMatchObject({ kind: "file", path: join(dir, "sub", "missing.csv"), existing: null });
  });

  test("a file with several hard links is written in place, so every name sees the new content", () => {
    expect(outputTarget("linked-1.csv", dir, "--csv")).toMatchObject({ kind: "file", inPlace: true });
  });

  test("a loop of links is refused", () => {
    expect(refusal("loop-a")).toBe("cannot write --csv 'loop-a': more than 40 symbolic links in a row | one of the links probably points back at itself");
  });
});

describe("outputTarget(given, cwd, label): refusals before any work (exit status 2)", () => {
  test("a missing folder, named as the user wrote it", () => {
    expect(refusal("no-such-folder/plot.svg", "--svg")).toBe(
      "cannot write --svg 'no-such-folder/plot.svg': the folder 'no-such-folder' does not exist | create it first (mkdir -p no-such-folder) or give another path",
    );
  });

  test("a folder given as the file, with or without a trailing slash", () => {
    expect(refusal("sub")).toBe("cannot write --csv 'sub': it is a folder | give a file name inside it");
    expect(refusal("sub/")).toBe("cannot write --csv 'sub/': it names a folder | give a file name inside it");
  });

  test("a path through a regular file (ENOTDIR, which even root cannot write through)", () => {
    expect(refusal("real.csv/out.csv")).toBe("cannot write --csv 'real.csv/out.csv': a part of the path before the file name is a file, not a folder | check the path");
  });

  test("a dangling link into a missing folder", () => {
    symlinkSync("nowhere/x.csv", join(dir, "dangling-far.csv"));
    expect(refusal("dangling-far.csv")).toBe(`cannot write --csv 'dangling-far.csv': the folder '${join(dir, "nowhere")}' does not exist | create it first (mkdir -p ${join(dir, "nowhere")}) or give another path`);
  });

  test("an empty name", () => {
    expect(refusal("")).toBe("--csv needs a file name | give a path, or - for standard output");
  });

  describe("a socket", () => {
    let server: Server;
    beforeAll(() => new Promise<void>((done) => (server = createServer().listen(join(dir, "sock"), done))));
    afterAll(() => new Promise<void>((done) => server.close(() => done())));
    test("is refused: it cannot be opened as a file", () => {
      expect(refusal("sock")).toBe("cannot write --csv 'sock': it is a socket; onset writes files, pipes and terminals | give a file name, or - for standard output");
    });
  });

  // A node of our own (loop device 7,0) in the test folder; it is only looked at, never opened.
  const canMakeDisk = mknod(join(dir, "disk"), "b", 7, 0);
  test.skipIf(!canMakeDisk)("a block device (a disk) is refused, never written onto (skipped only where mknod is not permitted)", () => {
    expect(refusal("disk")).toBe("cannot write --csv 'disk': it is a block device (a disk); onset never writes onto one | give a file name");
  });
});
