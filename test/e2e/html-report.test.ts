import { copyFileSync, readFileSync, writeFileSync } from "node:fs";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, test } from "vitest";
import { chromiumPath, gridDistance, inkGrid, launchChromium, type InkGrid } from "./support/browser.js";
import { Workspace } from "./support/onset.js";

// Issue 16: `onset run FILE --html report.html` writes one self-contained page, opened here in
// the system's headless Chromium (playwright-core, no browser download).
const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), "../..");
const REFERENCE = join(ROOT, "test/e2e/reference/report-ink.json");
const ws = new Workspace();
afterAll(() => ws.remove());

const EXAMPLES = ["bridge-excitation", "bridge-excitation-trimmer", "bridge-excitation-yield", "rc-filter-step", "twin-t-notch", "window"];
const COPIED = EXAMPLES.filter((name) => name !== "window");

beforeAll(async () => {
  for (const name of COPIED) copyFileSync(join(ROOT, "examples", `${name}.onset`), ws.path(`${name}.onset`));
  // Shorter studies than the examples' own, same circuits: the page is what is tested here.
  ws.write("bridge-excitation-trimmer.onset", readFileSync(ws.path("bridge-excitation-trimmer.onset"), "utf8").replace("steps=11", "steps=4"));
  ws.write("bridge-excitation-yield.onset", readFileSync(ws.path("bridge-excitation-yield.onset"), "utf8").replace("runs=200", "runs=12"));
  // A design window: the trimmer swept over three settings, four samples at each.
  ws.write("window.onset", 'include "bridge-excitation.onset"\nsweep P1.at from=0.4 to=0.6 steps=3\ntolerance runs=4 seed=7\nspec yield>50%\n');
  const runs = await Promise.all(EXAMPLES.map((name) => ws.run(["run", `${name}.onset`, "--html", `${name}.html`, "--quiet", "--jobs", "1"])));
  runs.forEach((r, k) => expect(r.stderr, EXAMPLES[k]).toBe(""));
}, 240_000);

const page = (name: string) => readFileSync(ws.path(`${name}.html`), "utf8");

describe("the HTML file", () => {
  test("is one self-contained document: no external script, style sheet, image or link; a content policy that fetches nothing", () => {
    for (const name of EXAMPLES) {
      const html = page(name);
      expect(html.startsWith("<!DOCTYPE html>"), name).toBe(true);
      expect(html, name).not.toMatch(/<script[^>]+src=|<link\b|<img\b|<iframe\b|@import|url\(\s*['"]?http/i);
      // The only URL is the SVG namespace, which names and fetches nothing.
      expect([...html.matchAll(/https?:\/\/[^\s"'<)]+/g)].map((m) => m[0]).filter((u) => u !== "http://www.w3.org/2000/svg"), name).toEqual([]);
      expect(html, name).toContain("default-src 'none'");
    }
  });

  test("holds what the text report says: verdict and explanation, settled figures with their error bars, harmonics, poles, the spec table and the terminal text", () => {
    const html = page("bridge-excitation");
    expect(html).toMatch(/start-up on <code>o<\/code>: <span class="verdict good">settled<\/span>/);
    expect(html).toMatch(/settled at 3\.\d+ V peak and 2\.44\d kHz/);
    expect(html).toMatch(/2441\.\d+ Hz ± 0\.\d+ Hz/);
    expect(html).toMatch(/<caption>harmonics \(numerical floor −\d+ dBc\)<\/caption>/);
    expect(html).toContain('data-analysis="poles"');
    expect(html).toMatch(/<td>thd&lt;3%<\/td><td class="num">2\.2\d+ %<\/td><td><span class="good">pass<\/span>/);
    expect(html).toContain("the report as printed on the terminal");
    expect(page("bridge-excitation-yield")).toMatch(/<code class="command">onset run bridge-excitation-yield\.onset --sample \d+<\/code>/);
    expect(page("bridge-excitation-trimmer")).toMatch(/start threshold: P1\.at = 0\.2\d+ ± /);
  });

  test("labels the tolerance histograms' spec limits in words, with each limit's yield", () => {
    const html = page("bridge-excitation-yield");
    const labels = [...html.matchAll(/class="marker-label"[^>]*>([^<]*)</g)].map((m) => m[1]);
    expect(labels).toEqual(["lowest allowed 2.375 kHz", "highest allowed 2.625 kHz", "at most 3 %", "at most 40 ms"]);
    expect(html).toMatch(/>frequency \(\d+(\.\d+)? % of samples meet the limit\)</);
    expect(html).toMatch(/tolerance, yield \d+(\.\d+)? % \(\d+ of 12\)/);
  });
});

const chromium = chromiumPath();
if (chromium === null) console.warn("html-report: no Chromium found (apt-get install -y chromium, or set ONSET_CHROMIUM): the browser tests are skipped");

describe.skipIf(chromium === null)("the report in headless Chromium", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchChromium(chromium!);
  }, 60_000);
  afterAll(async () => browser?.close());

  async function open(name: string, scheme: "light" | "dark" = "light"): Promise<{ page: Page; errors: string[] }> {
    const p = await browser.newPage({ viewport: { width: 1400, height: 1000 }, colorScheme: scheme });
    const errors: string[] = [];
    p.on("console", (m) => {
      if (m.type() === "error" || m.type() === "warning") errors.push(m.text());
    });
    p.on("pageerror", (e) => errors.push(String(e)));
    p.on("request", (r) => {
      if (!r.url().startsWith("file:") && !r.url().startsWith("data:")) errors.push(`fetched ${r.url()}`);
    });
    await p.goto(`file://${ws.path(`${name}.html`)}`);
    return { page: p, errors };
  }

  /** The plot area of a figure's (first) panel, scrolled into view, in page pixels. */
  async function plotArea(p: Page, figure: string) {
    const area = p.locator(`#${figure} rect.plot-area`).first();
    await area.scrollIntoViewIfNeeded();
    return (await area.boundingBox())!;
  }

  /** The visible x range of each plot panel, by its figure's id. */
  const views = (p: Page) =>
    p.evaluate(() => (window as unknown as { onsetReport: { panels: { figure: string; view: () => number[]; points: number }[] } }).onsetReport.panels.map((x) => ({ figure: x.figure, view: x.view(), points: x.points })));

  test.each(EXAMPLES)("%s: every panel renders with data, and nothing errs or is fetched", async (name) => {
    const { page: p, errors } = await open(name);
    const panels = await p.evaluate(() =>
      Array.from(document.querySelectorAll("figure.plot g.panel")).map((g) => ({
        figure: g.closest("figure")!.id,
        marks: g.querySelectorAll("g.zoom polyline, g.zoom rect, g.zoom circle").length,
        noData: g.querySelector(".no-data") !== null,
        box: (g.querySelector("rect.plot-area") as SVGRectElement).getBoundingClientRect().width,
      })),
    );
    expect(panels.length, name).toBeGreaterThan(0);
    for (const panel of panels) {
      expect(panel.marks, `${name} ${panel.figure}`).toBeGreaterThan(0);
      expect(panel.noData, `${name} ${panel.figure}`).toBe(false);
      expect(panel.box, `${name} ${panel.figure}`).toBeGreaterThan(100);
    }
    for (const v of await views(p)) expect(v.points, `${name} ${v.figure}`).toBeGreaterThan(0);
    expect(errors).toEqual([]);
    await p.close();
  });

  test("the start-up report has the whole run, the last cycles, the envelope in dB, the spectrum and the poles", async () => {
    const { page: p } = await open("bridge-excitation");
    const ids = (await views(p)).map((v) => v.figure);
    expect(ids).toEqual(["a1-run", "a1-last", "a1-envelope", "a1-spectrum", "a2-poles"]);
    const titles = await p.evaluate(() => Array.from(document.querySelectorAll("figure.plot svg > text.figure-title")).map((t) => t.textContent));
    expect(titles[1]).toBe("last 3 cycles");
    expect(titles[2]).toMatch(/^envelope in dB of the settled amplitude; growth 7\.\d+ dB\/ms$/);
    expect(await p.locator("#a1-spectrum .level-label").textContent()).toMatch(/^numerical floor −\d+ dBc$/);
    expect(await p.locator("#a2-poles .marker-label").textContent()).toBe("imaginary axis: grows to the right");
    await p.close();
  });

  test("zoom narrows the visible time range (with the linked envelope), moves the ticks, and a double-click restores it", async () => {
    const { page: p, errors } = await open("bridge-excitation");
    const before = await views(p);
    const whole = before.find((v) => v.figure === "a1-run")!.view;
    const ticksBefore = await p.locator("#a1-run .x-axis .tick-label").allTextContents();
    await p.locator('#a1-run button[data-action="in"]').click();
    await p.locator('#a1-run button[data-action="in"]').click();
    const after = await views(p);
    const zoomed = after.find((v) => v.figure === "a1-run")!.view;
    const span = (v: number[]) => v[1]! - v[0]!;
    expect(span(zoomed) / span(whole)).toBeCloseTo(0.25, 6);
    expect(span(after.find((v) => v.figure === "a1-envelope")!.view)).toBeCloseTo(span(zoomed), 12);
    // The last cycles are not linked: they keep their range.
    expect(after.find((v) => v.figure === "a1-last")!.view).toEqual(before.find((v) => v.figure === "a1-last")!.view);
    expect(await p.locator("#a1-run .x-axis .tick-label").allTextContents()).not.toEqual(ticksBefore);
    // The wheel zooms about the pointer.
    const box = await plotArea(p, "a1-run");
    await p.mouse.move(box.x + box.width * 0.8, box.y + box.height / 2);
    await p.mouse.wheel(0, -400);
    const wheeled = (await views(p)).find((v) => v.figure === "a1-run")!.view;
    expect(span(wheeled)).toBeLessThan(span(zoomed));
    // Dragging pans to earlier times.
    await p.mouse.down();
    await p.mouse.move(box.x + box.width * 0.95, box.y + box.height / 2, { steps: 4 });
    await p.mouse.up();
    const panned = (await views(p)).find((v) => v.figure === "a1-run")!.view;
    expect(panned[0]).toBeLessThan(wheeled[0]!);
    expect(span(panned)).toBeCloseTo(span(wheeled), 12);
    await p.mouse.dblclick(box.x + box.width / 2, box.y + box.height / 2);
    expect((await views(p)).find((v) => v.figure === "a1-run")!.view).toEqual(whole);
    expect(errors).toEqual([]);
    await p.close();
  });

  test("hovering a plot shows the values under the pointer", async () => {
    const { page: p } = await open("bridge-excitation");
    const box = await plotArea(p, "a1-last");
    await p.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    const tip = p.locator(".plot-tip");
    await expect.poll(() => tip.isVisible()).toBe(true);
    expect(await tip.textContent()).toMatch(/^−?\d[\d.]* m?V at \d[\d.]* ms$/);
    const spectrum = await plotArea(p, "a1-spectrum");
    await p.mouse.move(spectrum.x + spectrum.width * 0.03, spectrum.y + spectrum.height / 2);
    expect(await tip.textContent()).toMatch(/^harmonic: 0 dBc at 2\.44\d+ kHz/);
    await p.close();
  });

  test("follows the reader's dark preference: dark page and plot backgrounds", async () => {
    const { page: p } = await open("bridge-excitation", "dark");
    const colours = await p.evaluate(() => ({
      body: getComputedStyle(document.body).backgroundColor,
      plot: getComputedStyle(document.querySelector("#a1-run g.panel > rect")!).fill,
    }));
    const luminance = (rgb: string) => {
      const [r, g, b] = (rgb.match(/\d+/g) ?? []).map(Number);
      return (0.2126 * r! + 0.7152 * g! + 0.0722 * b!) / 255;
    };
    expect(luminance(colours.body)).toBeLessThan(0.2);
    expect(luminance(colours.plot)).toBeLessThan(0.2);
    await p.close();
  });

  test("prints on white without the zoom controls, every plot the width of the page, folded tables open", async () => {
    const { page: p } = await open("bridge-excitation", "dark");
    await p.evaluate(() => window.dispatchEvent(new Event("beforeprint")));
    await p.emulateMedia({ media: "print" });
    const printed = await p.evaluate(() => ({
      body: getComputedStyle(document.body).backgroundColor,
      bars: Array.from(document.querySelectorAll(".zoom-bar")).map((b) => getComputedStyle(b).display),
      widths: Array.from(document.querySelectorAll("figure.plot")).map((f) => f.getBoundingClientRect().width / document.querySelector("main")!.getBoundingClientRect().width),
      folded: Array.from(document.querySelectorAll("details.more")).map((d) => (d as HTMLDetailsElement).open),
    }));
    expect(printed.body).toBe("rgb(255, 255, 255)");
    expect(new Set(printed.bars)).toEqual(new Set(["none"]));
    for (const w of printed.widths) expect(w).toBeGreaterThan(0.9);
    expect(printed.folded).toEqual([true]);
    await p.close();
  });

  test("screenshots keep their structure: each plot against the committed ink grid, and zoom changes it", async () => {
    const { page: p } = await open("bridge-excitation");
    const grids: Record<string, InkGrid> = {};
    for (const id of ["a1-run", "a1-last", "a1-envelope", "a1-spectrum", "a2-poles"]) {
      grids[id] = await inkGrid(browser, await p.locator(`#${id} svg`).screenshot(), 12, 6);
      expect(Math.max(...grids[id].cells), id).toBeGreaterThan(0.05);
    }
    if (process.env.ONSET_UPDATE_REFERENCE === "1") writeFileSync(REFERENCE, `${JSON.stringify(grids, null, 1)}\n`);
    const reference = JSON.parse(readFileSync(REFERENCE, "utf8")) as Record<string, InkGrid>;
    for (const id of Object.keys(grids)) expect(gridDistance(grids[id]!, reference[id]!), id).toBeLessThan(0.15);
    await p.locator('#a1-run button[data-action="in"]').click();
    await p.locator('#a1-run button[data-action="in"]').click();
    await p.locator('#a1-run button[data-action="in"]').click();
    const zoomed = await inkGrid(browser, await p.locator("#a1-run svg").screenshot(), 12, 6);
    expect(gridDistance(zoomed, grids["a1-run"]!)).toBeGreaterThan(0.15);
    await p.close();
  });
});
