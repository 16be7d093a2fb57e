import { spawn } from "node:child_process";
import { chmodSync, lstatSync, mkdirSync, readdirSync, readFileSync, statSync, symlinkSync, writeFileSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, test } from "vitest";
import { mkfifo, mknodNull, readFifo } from "../support/special-files.js";
import { MAIN, onset, RC_STEP, Workspace } from "./support/onset.js";

// Issue 11: every output is written safely. None of these tests touches the machine's /dev
// entries: FIFOs, links and device nodes are made in the test's own folder, and /dev/fd/3 is a
// pipe this test opens for the command.
const ws = new Workspace();
afterAll(() => ws.remove());

/** The same RC step with 5000 points: its CSV (≈ 300 kB) is bigger than a pipe holds. */
const RC_FINE = RC_STEP.replace("max-step=10u", "max-step=1u");
/** An RC step that would take hours to simulate: an output check that passes lets the test time out. */
const RC_ENDLESS = RC_STEP.replace("until=5m max-step=10u", "until=1000 max-step=1n");
const TWO_ANALYSES = `${RC_STEP}transient until=1m probes=(o)\n`;

let reference: string;
beforeAll(async () => {
  ws.write("rc.onset", RC_STEP);
  ws.write("fine.onset", RC_FINE);
  ws.write("endless.onset", RC_ENDLESS);
  ws.write("two.onset", TWO_ANALYSES);
  expect((await ws.run(["run", "rc.onset", "--csv", "reference.csv", "--quiet"])).status).toBe(0);
  reference = readFileSync(ws.path("reference.csv"), "utf8");
});

describe("- is standard output", () => {
  test("--csv - prints the CSV alone on stdout (the report moves to stderr) and writes no file named -", async () => {
    const r = await ws.run(["run", "rc.onset", "--csv", "-"]);
    expect(r.status).toBe(0);
    expect(r.stdout).toBe(reference);
    expect(r.stderr).toContain("RC charge");
    expect(r.stderr).toMatch(/transient to 5 ms/);
    expect(readdirSync(ws.dir)).not.toContain("-");
  });

  // Through a link of our own, so a regression could only ever replace the link, not /dev/stdout.
  test("--csv to a link to /dev/stdout is the same as -: the command's stdout is written, nothing replaced", async () => {
    symlinkSync("/dev/stdout", ws.path("stdout-link"));
    const r = await ws.run(["run", "rc.onset", "--csv", "stdout-link", "--quiet"]);
    expect(r.status).toBe(0);
    expect(r.stdout).toBe(reference);
    expect(lstatSync(ws.path("stdout-link")).isSymbolicLink()).toBe(true);
  });

  test("--json and --csv - cannot share stdout: exit 2 with a JSON error document, before any work", async () => {
    const r = await ws.run(["run", "endless.onset", "--csv", "-", "--json"]);
    expect(r.status).toBe(2);
    const doc = JSON.parse(r.stdout) as { error: { code: string; message: string; hint: string }; exit: number };
    expect(doc.error).toMatchObject({ code: "stdout-taken", message: "--json prints its document on standard output, and so would --csv -", hint: "give --csv a file name, or drop --json" });
    expect(doc.exit).toBe(2);
  });

  test("a stream takes one document: two analyses with --csv - is exit 2 before the simulation", async () => {
    const r = await ws.run(["run", "two.onset", "--csv", "-"]);
    expect(r.status).toBe(2);
    expect(r.stdout).toBe("");
    expect(r.stderr).toBe(
      "error: --csv - is standard output, which takes one document, but this run makes 2 CSV tables\nhint: give --csv a file name: the documents go to FILE, FILE-2, … (one per analysis)\n",
    );
  });

  test("design --output - prints the circuit file on stdout", async () => {
    const [plain, dash] = await Promise.all([ws.run(["design", "wien", "--freq", "1k"]), ws.run(["design", "wien", "--freq", "1k", "--output", "-"])]);
    expect(dash.status).toBe(0);
    expect(dash.stdout).toBe(plain.stdout);
  });
});

describe("FIFOs, devices and descriptors are written in place, never replaced", () => {
  test("a FIFO with a reader gets the whole CSV and is still a FIFO afterwards", async () => {
    mkfifo(ws.path("csv.fifo"));
    const reader = readFifo(ws.path("csv.fifo"), ws.path("from-fifo.csv"));
    const r = await ws.run(["run", "rc.onset", "--csv", "csv.fifo"]);
    expect(r.status).toBe(0);
    expect(await reader).toBe(0);
    expect(readFileSync(ws.path("from-fifo.csv"), "utf8")).toBe(reference);
    expect(lstatSync(ws.path("csv.fifo")).isFIFO()).toBe(true);
    expect(r.stderr).toContain("wrote csv.fifo");
  });

  test("/dev/fd/3, a pipe this test opens for the command, receives the whole document (bigger than a pipe holds)", async () => {
    const [r, file] = await Promise.all([onset(["run", "fine.onset", "--csv", "/dev/fd/3", "--quiet"], { cwd: ws.dir, fd3: true }), ws.run(["run", "fine.onset", "--csv", "fine.csv", "--quiet"])]);
    expect(r.status).toBe(0);
    expect(file.status).toBe(0);
    const expected = readFileSync(ws.path("fine.csv"), "utf8");
    expect(expected.length).toBeGreaterThan(65536);
    expect(r.fd3).toBe(expected);
  });

  test("--svg >(…) from a shell (process substitution, a /dev/fd/N pipe) receives the plot", async () => {
    const status = await new Promise<number | null>((done, fail) => {
      const script = `node "$0" run rc.onset --quiet --svg >(cat > from-shell.svg); s=$?; wait $!; exit $s`;
      const child = spawn("bash", ["-c", script, MAIN], { cwd: ws.dir, stdio: "ignore" });
      child.on("error", fail);
      child.on("close", done);
    });
    expect(status).toBe(0);
    await ws.run(["run", "rc.onset", "--quiet", "--svg", "rc.svg"]);
    expect(readFileSync(ws.path("from-shell.svg"), "utf8")).toBe(readFileSync(ws.path("rc.svg"), "utf8"));
  });

  const canMknod = mknodNull(ws.path("null-node"));
  test.skipIf(!canMknod)("a character device of our own (a null node made with mknod) is written and stays that device (skipped only where mknod is not permitted)", async () => {
    const before = statSync(ws.path("null-node"));
    const r = await ws.run(["run", "rc.onset", "--csv", "null-node", "--svg", "null-node-plot.svg", "--quiet"]);
    expect(r.status).toBe(0);
    const after = lstatSync(ws.path("null-node"));
    expect(after.isCharacterDevice()).toBe(true);
    expect([after.ino, after.rdev]).toEqual([before.ino, before.rdev]);
  });

  test("a FIFO whose reader goes away: exit 2 with a plain message, never an internal error", async () => {
    mkfifo(ws.path("short.fifo"));
    const reader = readFifo(ws.path("short.fifo"), ws.path("short.out"), 100);
    const r = await ws.run(["run", "fine.onset", "--csv", "short.fifo"]);
    await reader;
    expect(r.status).toBe(2);
    expect(r.stderr).toContain("error: cannot write --csv 'short.fifo': the program reading it went away before onset finished writing (EPIPE)");
    expect(r.stderr).not.toContain("internal error");
  });
});

describe("symlinks are followed: the real file is replaced and the link stays", () => {
  test("--csv through a link", async () => {
    writeFileSync(ws.path("real.csv"), "old content\n");
    symlinkSync("real.csv", ws.path("link.csv"));
    const r = await ws.run(["run", "rc.onset", "--csv", "link.csv", "--quiet"]);
    expect(r.status).toBe(0);
    expect(lstatSync(ws.path("link.csv")).isSymbolicLink()).toBe(true);
    expect(readFileSync(ws.path("real.csv"), "utf8")).toBe(reference);
  });

  test("format --write through a link formats the real file", async () => {
    writeFileSync(ws.path("messy.onset"), "resistor R1 in  o 10k\nvsource V1 in gnd 5\n\n\nbias\n");
    symlinkSync("messy.onset", ws.path("messy-link.onset"));
    const expected = (await ws.run(["format", "messy.onset"])).stdout;
    expect(expected).not.toBe(readFileSync(ws.path("messy.onset"), "utf8"));
    const r = await ws.run(["format", "messy-link.onset", "--write"]);
    expect(r.status).toBe(0);
    expect(lstatSync(ws.path("messy-link.onset")).isSymbolicLink()).toBe(true);
    expect(readFileSync(ws.path("messy.onset"), "utf8")).toBe(expected);
  });

  test("design --output through a link writes the design into the real file", async () => {
    writeFileSync(ws.path("design-real.onset"), "old\n");
    symlinkSync("design-real.onset", ws.path("design-link.onset"));
    const [r, printed] = await Promise.all([ws.run(["design", "wien", "--freq", "1k", "--output", "design-link.onset"]), ws.run(["design", "wien", "--freq", "1k"])]);
    expect(r.status).toBe(0);
    expect(lstatSync(ws.path("design-link.onset")).isSymbolicLink()).toBe(true);
    expect(readFileSync(ws.path("design-real.onset"), "utf8")).toBe(printed.stdout);
  });

  test("format --write refuses a FIFO (it rewrites files only), before reading it", async () => {
    mkfifo(ws.path("format.fifo"));
    const r = await ws.run(["format", "format.fifo", "--write"]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain("format --write rewrites a circuit file, and 'format.fifo' is not one");
  });
});

describe("every output is checked before the simulation starts: exit 2, a plain message", () => {
  // endless.onset would simulate for hours: these runs end only because the check comes first.
  test("a missing output folder", async () => {
    const r = await ws.run(["run", "endless.onset", "--svg", "plots/endless.svg"]);
    expect(r.status).toBe(2);
    expect(r.stderr).toBe("error: cannot write --svg 'plots/endless.svg': the folder 'plots' does not exist\nhint: create it first (mkdir -p plots) or give another path\n");
  });

  test("a folder given as the output file", async () => {
    mkdirSync(ws.path("out"));
    const r = await ws.run(["run", "endless.onset", "--csv", "out"]);
    expect(r.status).toBe(2);
    expect(r.stderr).toBe("error: cannot write --csv 'out': it is a folder\nhint: give a file name inside it\n");
  });

  test("a path through a regular file (not writable even for root)", async () => {
    const r = await ws.run(["run", "endless.onset", "--csv", "rc.onset/data.csv"]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain("cannot write --csv 'rc.onset/data.csv': a part of the path before the file name is a file, not a folder");
  });

  test("an output that would overwrite the circuit file", async () => {
    const r = await ws.run(["run", "endless.onset", "--svg", "endless.onset"]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain("--svg 'endless.onset' is the input file 'endless.onset'");
  });

  test("the results file of a study, given or by default beside the circuit", async () => {
    ws.write("study.onset", RC_ENDLESS.replace("transient", "tolerance runs=4 seed=1\ntransient").replace("10k", "10k±1%"));
    const given = await ws.run(["run", "study.onset", "--results", "nowhere/r.jsonl", "--jobs", "1"]);
    expect(given.status).toBe(2);
    expect(given.stderr).toContain("cannot write --results 'nowhere/r.jsonl': the folder 'nowhere' does not exist");
    const csv = await ws.run(["run", "study.onset", "--csv", "nowhere/s.csv", "--jobs", "1"]);
    expect(csv.status).toBe(2);
    // The study never started: its default results file was not even begun.
    expect(readdirSync(ws.dir)).not.toContain("study.results.jsonl");
  });

  // Root may write anywhere, so unwritable places are tried as an unprivileged user (nobody),
  // which only root can switch to: the CI user is root.
  const root = process.getuid?.() === 0;
  test.skipIf(!root)("an unwritable folder and a read-only file, for an unprivileged user (skipped only when the tests do not run as root)", async () => {
    const asNobody = (args: string[]) =>
      new Promise<{ status: number | null; stderr: string }>((done, fail) => {
        const child = spawn(process.execPath, [MAIN, ...args], { cwd: ws.dir, uid: 65534, gid: 65534, stdio: ["ignore", "ignore", "pipe"] });
        let stderr = "";
        child.stderr.setEncoding("utf8").on("data", (d: string) => (stderr += d));
        child.on("error", fail);
        child.on("close", (status) => done({ status, stderr }));
      });
    chmodSync(ws.dir, 0o755);
    mkdirSync(ws.path("locked"), 0o555);
    writeFileSync(ws.path("frozen.csv"), "kept\n", { mode: 0o444 });
    const [folder, file] = await Promise.all([asNobody(["run", "endless.onset", "--csv", "locked/data.csv"]), asNobody(["run", "endless.onset", "--csv", "frozen.csv"])]);
    expect(folder).toEqual({ status: 2, stderr: "error: cannot write --csv 'locked/data.csv': the folder 'locked' is not writable: permission denied (EACCES)\nhint: choose a folder you can write to\n" });
    expect(file).toEqual({ status: 2, stderr: "error: cannot write --csv 'frozen.csv': it is not writable: permission denied (EACCES)\nhint: make it writable or give another path\n" });
    expect(readFileSync(ws.path("frozen.csv"), "utf8")).toBe("kept\n");
  });

  test("no temporary files are left anywhere in the folder", () => {
    expect(readdirSync(ws.dir).filter((f) => f.endsWith(".tmp"))).toEqual([]);
  });
});
