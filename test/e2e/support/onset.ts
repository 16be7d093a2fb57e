import { spawn } from "node:child_process";
import { existsSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";

/** The built command; the test command builds the packages before running the suite. */
export const MAIN = resolve(dirname(fileURLToPath(import.meta.url)), "../../../packages/cli/dist/main.js");

/** What one run of the command left behind. */
export interface Ran {
  readonly status: number | null;
  readonly stdout: string;
  readonly stderr: string;
}

/**
 * Runs `node packages/cli/dist/main.js ...args` in `cwd`, with `input` on standard input. With
 * `fd3`, the command also gets a pipe as descriptor 3 (what `/dev/fd/3` names inside it), and
 * what it wrote there comes back as `fd3`.
 */
export function onset(args: readonly string[], options: { cwd: string; input?: string; env?: Record<string, string>; fd3?: boolean }): Promise<Ran & { fd3?: string }> {
  if (!existsSync(MAIN)) throw new Error(`${MAIN} is missing: build first (pnpm build), the e2e tests run the built command`);
  return new Promise((done, fail) => {
    const env: Record<string, string | undefined> = { ...process.env, ...options.env };
    delete env.NO_COLOR;
    delete env.FORCE_COLOR;
    const child = spawn(process.execPath, [MAIN, ...args], { cwd: options.cwd, env, stdio: options.fd3 ? ["pipe", "pipe", "pipe", "pipe"] : ["pipe", "pipe", "pipe"] });
    let stdout = "";
    let stderr = "";
    let fd3 = "";
    child.stdout!.setEncoding("utf8").on("data", (d: string) => (stdout += d));
    child.stderr!.setEncoding("utf8").on("data", (d: string) => (stderr += d));
    if (options.fd3) (child.stdio[3] as NodeJS.ReadableStream).setEncoding("utf8").on("data", (d: string) => (fd3 += d));
    child.on("error", fail);
    child.on("close", (status) => done({ status, stdout, stderr, ...(options.fd3 ? { fd3 } : {}) }));
    child.stdin!.end(options.input ?? "");
  });
}

/** A fresh folder for one test file, with circuit files written into it. */
export class Workspace {
  readonly dir = mkdtempSync(join(tmpdir(), "onset-e2e-"));

  write(name: string, text: string): string {
    writeFileSync(join(this.dir, name), text);
    return name;
  }

  path(name: string): string {
    return join(this.dir, name);
  }

  run(args: readonly string[], input?: string, env?: Record<string, string>): Promise<Ran> {
    return onset(args, { cwd: this.dir, ...(input === undefined ? {} : { input }), ...(env === undefined ? {} : { env }) });
  }

  remove(): void {
    rmSync(this.dir, { recursive: true, force: true });
  }
}

/** A resistive divider from 5 V: the bias point is 2.5 V by Ohm's law. */
export const DIVIDER = `title "Half-supply divider"
vsource  V1 in  gnd 5
resistor R1 in  m   10k
resistor R2 m   gnd 10k
bias
`;

/** RC charging from rest through R = 10 kΩ into C = 100 nF: τ = RC = 1 ms. */
export const RC_STEP = `title "RC charge"
vsource   V1 in gnd 5
resistor  R1 in o   10k
capacitor C1 o  gnd 100n
transient until=5m max-step=10u start=rest probes=(o, R1.i)
`;

/**
 * Wien-bridge oscillator of our own: R = 10 kΩ, C = 10 nF (f₀ = 1/(2πRC) ≈ 1.59 kHz), amplifier
 * gain 1 + Rf/Rg = 3.2 (above the Barkhausen threshold of 3), clipping on the op-amp's rails.
 */
export function wien(analyses: string): string {
  return `title "Bench Wien oscillator"
param R = 10k
param C = 10n
resistor  R1 o  s   (R)±1%
capacitor C1 s  p   (C)±5%
resistor  R2 p  gnd (R)±1%
capacitor C2 p  gnd (C)±5%
resistor  Rf o  n   22k±1%
resistor  Rg n  gnd 10k±1%
opamp     U1 p  n   o  preset=general
${analyses}`;
}
