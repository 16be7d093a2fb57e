import cliProgress from "cli-progress";
import type { ProgressListener } from "@onset/core";
import { formatSI } from "./format/index.js";

/**
 * Progress on a terminal: one bar with simulated time and its rate (or samples done and their
 * rate). Without a terminal stream nothing is drawn at all.
 */
export class Progress {
  private bar: cliProgress.SingleBar | undefined;
  private startedAt = 0;
  private lastUntil = NaN;

  constructor(private readonly stream: NodeJS.WriteStream | undefined) {}

  private draw(label: string, fraction: number, detail: string): void {
    if (!this.stream) return;
    if (!this.bar) {
      this.bar = new cliProgress.SingleBar(
        {
          stream: this.stream,
          format: "{label} {bar} {percentage}% | {detail}",
          barsize: 28,
          hideCursor: true,
          clearOnComplete: true,
          fps: 8,
        },
        cliProgress.Presets.shades_grey,
      );
      this.bar.start(1000, 0, { label, detail });
    }
    this.bar.update(Math.round(Math.max(0, Math.min(1, fraction)) * 1000), { label, detail });
  }

  /** A listener for one simulation: simulated time against the end time, and simulated seconds per second. */
  simulation(label: string): ProgressListener {
    this.startedAt = Date.now();
    this.lastUntil = NaN;
    return (time, until) => {
      if (Number.isFinite(until)) this.lastUntil = until;
      const elapsed = Math.max(1e-3, (Date.now() - this.startedAt) / 1000);
      const of = Number.isFinite(this.lastUntil) ? ` of ${formatSI(this.lastUntil, "s", 3)}` : "";
      this.draw(label, Number.isFinite(this.lastUntil) ? time / this.lastUntil : 0, `${formatSI(time, "s", 3)}${of} simulated, ${formatSI(time / elapsed, "s", 3)}/s`);
    };
  }

  /** A counter of finished items (samples, settings) with their rate. */
  counter(label: string, total: number): (done: number) => void {
    this.startedAt = Date.now();
    return (done) => {
      const elapsed = Math.max(1e-3, (Date.now() - this.startedAt) / 1000);
      this.draw(label, total > 0 ? done / total : 0, `${done} of ${total} ${label}, ${formatSI(done / elapsed, "", 3)}/s`);
    };
  }

  /** Removes the bar (before the report is printed). */
  stop(): void {
    this.bar?.stop();
    this.bar = undefined;
  }
}
