import { existsSync } from "node:fs";
import type { Browser } from "playwright-core";

/** Where Debian and Ubuntu put their Chromium; `ONSET_CHROMIUM` names another. */
const CANDIDATES = ["/usr/bin/chromium", "/usr/bin/chromium-browser", "/usr/lib/chromium/chromium", "/snap/bin/chromium"];

/** The system's Chromium, or null when none is installed (.ci/run installs it from the Debian packages). */
export function chromiumPath(): string | null {
  const given = process.env.ONSET_CHROMIUM;
  if (given !== undefined && given !== "") return existsSync(given) ? given : null;
  return CANDIDATES.find((p) => existsSync(p)) ?? null;
}

/** Starts the system's Chromium headless through playwright-core (which downloads no browser of its own). */
export async function launchChromium(path: string): Promise<Browser> {
  const { chromium } = await import("playwright-core");
  return chromium.launch({ executablePath: path, headless: true, args: ["--no-sandbox", "--disable-gpu", "--font-render-hinting=none"] });
}

/** A screenshot reduced to its structure: the share of inked pixels in each cell of a coarse grid. */
export interface InkGrid {
  readonly columns: number;
  readonly rows: number;
  /** Row by row, each cell's share (0…1) of pixels that differ clearly from the background. */
  readonly cells: readonly number[];
}

/**
 * The ink grid of a PNG, decoded by the browser itself (a blank page draws it on a canvas), so
 * no image library is needed. The background is the colour of the top-left pixel.
 */
export async function inkGrid(browser: Browser, png: Buffer, columns: number, rows: number): Promise<InkGrid> {
  const page = await browser.newPage();
  try {
    const cells = await page.evaluate(
      async ({ data, columns, rows }) => {
        const image = new Image();
        image.src = `data:image/png;base64,${data}`;
        await image.decode();
        const canvas = document.createElement("canvas");
        canvas.width = image.naturalWidth;
        canvas.height = image.naturalHeight;
        const context = canvas.getContext("2d")!;
        context.drawImage(image, 0, 0);
        const { data: px, width, height } = context.getImageData(0, 0, canvas.width, canvas.height);
        const [r0, g0, b0] = [px[0]!, px[1]!, px[2]!];
        const inked = new Array<number>(columns * rows).fill(0);
        const total = new Array<number>(columns * rows).fill(0);
        for (let y = 0; y < height; y++) {
          for (let x = 0; x < width; x++) {
            const i = 4 * (y * width + x);
            const cell = Math.min(rows - 1, Math.floor((y / height) * rows)) * columns + Math.min(columns - 1, Math.floor((x / width) * columns));
            total[cell]! += 1;
            if (Math.max(Math.abs(px[i]! - r0), Math.abs(px[i + 1]! - g0), Math.abs(px[i + 2]! - b0)) > 40) inked[cell]! += 1;
          }
        }
        return inked.map((n, k) => (total[k]! > 0 ? n / total[k]! : 0));
      },
      { data: png.toString("base64"), columns, rows },
    );
    return { columns, rows, cells };
  } finally {
    await page.close();
  }
}

/** The largest difference between two grids' cells (1 when their shapes differ). */
export function gridDistance(a: InkGrid, b: InkGrid): number {
  if (a.columns !== b.columns || a.rows !== b.rows) return 1;
  return a.cells.reduce((worst, v, k) => Math.max(worst, Math.abs(v - (b.cells[k] ?? 0))), 0);
}
