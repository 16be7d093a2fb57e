import { spawn } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, test } from "vitest";
import { writeAll } from "../../../packages/cli/src/output/descriptor.js";

const dir = mkdtempSync(join(tmpdir(), "onset-descriptor-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("writeAll(fd, text)", () => {
  test("a non-blocking pipe whose reader starts late still gets every byte (EAGAIN waits, partial writes continue)", async () => {
    // The parent's end of a child's stdin pipe is non-blocking; the child reads only after a
    // pause, so the 1 MB document meets a full pipe (64 KiB) many times.
    const out = join(dir, "late.out");
    const child = spawn("sh", ["-c", 'sleep 0.3; cat > "$0"', out], { stdio: ["pipe", "ignore", "ignore"] });
    const closed = new Promise<number | null>((done) => child.on("close", done));
    const fd = (child.stdin as unknown as { _handle: { fd: number } })._handle.fd;
    expect(fd).toBeGreaterThan(2);
    const text = "0123456789abcdef\n".repeat(64 * 1024);
    writeAll(fd, text);
    child.stdin!.end();
    expect(await closed).toBe(0);
    expect(readFileSync(out, "utf8")).toBe(text);
  });

  test("multi-byte characters are written as UTF-8 bytes, whole", async () => {
    const out = join(dir, "utf8.out");
    const child = spawn("sh", ["-c", 'cat > "$0"', out], { stdio: ["pipe", "ignore", "ignore"] });
    const closed = new Promise<number | null>((done) => child.on("close", done));
    const text = "Ω µs ±1 % — 10 kΩ\n".repeat(5000);
    writeAll((child.stdin as unknown as { _handle: { fd: number } })._handle.fd, text);
    child.stdin!.end();
    expect(await closed).toBe(0);
    expect(readFileSync(out, "utf8")).toBe(text);
  });
});
