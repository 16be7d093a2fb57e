/// <reference lib="dom" />
/**
 * The report page's one script, run in the browser: zoom and pan on time axes, values on
 * hover. The page carries it as the source text of {@link reportClient} (see `page.ts`), so it
 * must not use anything from outside its own body — no imports, no module-level names.
 *
 * It works on the inline SVG the plot renderer wrote: each `g.panel` states its plot box and
 * domains in data attributes, and each figure's hover data (`script.plot-data`) lists the
 * points of its series in the panels' order. Zoom stretches the panel's `g.zoom` group along
 * x (strokes keep their width through `vector-effect`), moves the markers and redraws the x
 * ticks; everything else stays as the server drew it, so the page prints the same without
 * the script.
 */
export function reportClient(): void {
  type Series = { name: string; unit: string; x: number[]; y: number[]; sorted: boolean };
  type PanelState = {
    g: SVGGElement;
    box: [number, number, number, number];
    base: [number, number];
    view: [number, number];
    xLog: boolean;
    y: [number, number];
    yLog: boolean;
    xUnit: string;
    yUnit: string;
    series: Series[];
    zoomable: boolean;
    group: PanelState[];
    cross: SVGLineElement | null;
  };
  const NS = "http://www.w3.org/2000/svg";
  const MINUS = "\u2212";
  const PREFIXES: Record<string, string> = { "-15": "f", "-12": "p", "-9": "n", "-6": "\u00b5", "-3": "m", "0": "", "3": "k", "6": "M", "9": "G", "12": "T" };
  const BARE_UNITS = ["", "1", "%", "dB", "dBc", "\u00b0"];

  function trimZeros(text: string): string {
    return text.indexOf(".") < 0 ? text : text.replace(/0+$/, "").replace(/\.$/, "");
  }

  /** A value with an SI prefix, rounded to `digits` significant digits. */
  function si(value: number, unit: string, digits: number): string {
    if (!isFinite(value)) return "\u2014";
    const sign = value < 0 ? MINUS : "";
    const a = Math.abs(value);
    const join = (n: string, u: string) => (u === "" || u === "1" ? n : u === "\u00b0" ? n + u : n + " " + u);
    if (BARE_UNITS.indexOf(unit) >= 0 || a === 0) return join(sign + trimZeros(a.toPrecision(digits)), unit);
    let e = Math.floor(Math.log10(Number(a.toPrecision(digits))) / 3) * 3;
    e = Math.max(-15, Math.min(12, e));
    const m = a / Math.pow(10, e);
    return join(sign + trimZeros(m.toPrecision(digits)), PREFIXES[String(e)] + unit);
  }

  /** Tick values: multiples of a 1-2-5 step, about `count` intervals over [lo, hi]. */
  function ticks(lo: number, hi: number, count: number): { values: number[]; step: number } {
    const raw = (hi - lo) / Math.max(1, count);
    const power = Math.pow(10, Math.floor(Math.log10(raw)));
    const n = raw / power;
    const step = (n < Math.SQRT2 ? 1 : n < Math.sqrt(10) ? 2 : n < Math.sqrt(50) ? 5 : 10) * power;
    const values: number[] = [];
    for (let i = Math.ceil(lo / step - 1e-9); i <= Math.floor(hi / step + 1e-9) && values.length < 100; i++) values.push(i * step);
    return { values, step };
  }

  /** Tick labels with one prefix for the axis and just enough decimals for the step. */
  function tickLabels(values: number[], step: number, unit: string): string[] {
    const bare = BARE_UNITS.indexOf(unit) >= 0;
    const largest = values.reduce((m, v) => Math.max(m, Math.abs(v)), 0);
    const e = bare || largest === 0 ? 0 : Math.max(-15, Math.min(12, Math.floor(Math.log10(largest) / 3) * 3));
    const decimals = Math.max(0, -Math.floor(Math.log10(step / Math.pow(10, e)) + 1e-9));
    const u = bare ? unit : PREFIXES[String(e)] + unit;
    return values.map((v) => {
      const m = v / Math.pow(10, e);
      const text = Math.abs(m) < step / Math.pow(10, e) / 1e6 ? "0" : (m < 0 ? MINUS : "") + Math.abs(m).toFixed(decimals);
      return u === "" ? text : u === "\u00b0" ? text + u : text + " " + u;
    });
  }

  function svgElement(name: string, attributes: Record<string, string | number>): SVGElement {
    const el = document.createElementNS(NS, name) as SVGElement;
    for (const key in attributes) el.setAttribute(key, String(attributes[key]));
    return el;
  }

  function numbers(text: string | null): number[] {
    return (text ?? "").split(" ").filter((s) => s !== "" && s !== "log").map(Number);
  }

  function xPixel(p: PanelState, v: number, view: [number, number]): number {
    const [x, , w] = p.box;
    if (p.xLog) return x + ((Math.log10(v) - Math.log10(view[0])) / (Math.log10(view[1]) - Math.log10(view[0]))) * w;
    return x + ((v - view[0]) / (view[1] - view[0])) * w;
  }

  function xValue(p: PanelState, pixel: number): number {
    const [x, , w] = p.box;
    const f = (pixel - x) / w;
    if (p.xLog) return Math.pow(10, Math.log10(p.view[0]) + f * (Math.log10(p.view[1]) - Math.log10(p.view[0])));
    return p.view[0] + f * (p.view[1] - p.view[0]);
  }

  function yPixel(p: PanelState, v: number): number {
    const [, y, , h] = p.box;
    if (p.yLog) return y + h - ((Math.log10(v) - Math.log10(p.y[0])) / (Math.log10(p.y[1]) - Math.log10(p.y[0]))) * h;
    return y + h - ((v - p.y[0]) / (p.y[1] - p.y[0])) * h;
  }

  /** Draws the panel at its current view: stretched data, moved markers, new x ticks. */
  function draw(p: PanelState): void {
    const [x0, y0, w, h] = p.box;
    const [d0, d1] = p.base;
    const [c0, c1] = p.view;
    const k = (d1 - d0) / (c1 - c0);
    const offset = ((c0 - d0) / (d1 - d0)) * w;
    const zoom = p.g.querySelector("g.zoom");
    if (zoom) zoom.setAttribute("transform", k === 1 && c0 === d0 ? "" : `translate(${x0 - (x0 + offset) * k} 0) scale(${k} 1)`);
    p.g.querySelectorAll<SVGGElement>("g.marker").forEach((m) => {
      const v = Number(m.getAttribute("data-x"));
      const shift = xPixel(p, v, p.view) - xPixel(p, v, p.base);
      m.setAttribute("transform", `translate(${shift} 0)`);
      m.style.display = v < c0 || v > c1 ? "none" : "";
    });
    const axis = p.g.querySelector("g.x-axis");
    const grid = p.g.querySelector("g.grid");
    if (!axis || !grid) return;
    p.g.querySelectorAll(".x-grid, g.x-axis .tick-label, g.x-axis .tick-marks > line").forEach((el) => el.remove());
    const marks = axis.querySelector("g.tick-marks") ?? axis.appendChild(svgElement("g", { class: "tick-marks" }));
    const t = ticks(c0, c1, Math.max(3, Math.min(12, w / 140)));
    const labels = tickLabels(t.values, t.step, p.xUnit);
    t.values.forEach((v, i) => {
      const x = xPixel(p, v, p.view);
      grid.insertBefore(svgElement("line", { class: "x-grid", x1: x, y1: y0, x2: x, y2: y0 + h, stroke: "#e7e8ea", "stroke-width": 0.8 }), grid.firstChild);
      marks.appendChild(svgElement("line", { x1: x, y1: y0 + h, x2: x, y2: y0 + h + 4, stroke: "#8a8d93", "stroke-width": 0.8 }));
      const label = svgElement("text", { class: "tick-label", x, y: y0 + h + 18.5, "text-anchor": "middle", "font-size": 11.5, fill: "#62666e" });
      label.textContent = labels[i] ?? "";
      axis.appendChild(label);
    });
  }

  function setView(p: PanelState, lo: number, hi: number): void {
    const [d0, d1] = p.base;
    const least = (d1 - d0) * 1e-6;
    if (hi - lo < least) {
      const mid = (lo + hi) / 2;
      lo = mid - least / 2;
      hi = mid + least / 2;
    }
    const span = Math.min(hi - lo, d1 - d0);
    lo = Math.max(d0, Math.min(lo, d1 - span));
    for (const q of p.group) {
      q.view = [lo, lo + span];
      draw(q);
    }
  }

  /** The nearest point of a series to an x value (sorted x), or to a pixel (scatter). */
  function nearest(p: PanelState, s: Series, v: number, px: number, py: number): number {
    if (s.sorted) {
      let lo = 0;
      let hi = s.x.length - 1;
      while (hi - lo > 1) {
        const mid = (lo + hi) >> 1;
        if ((s.x[mid] as number) < v) lo = mid;
        else hi = mid;
      }
      return Math.abs((s.x[lo] as number) - v) <= Math.abs((s.x[hi] as number) - v) ? lo : hi;
    }
    let best = -1;
    let distance = Infinity;
    s.x.forEach((x, i) => {
      const d = Math.hypot(xPixel(p, x, p.view) - px, yPixel(p, s.y[i] as number) - py);
      if (d < distance) {
        distance = d;
        best = i;
      }
    });
    return best;
  }

  const tip = document.createElement("div");
  tip.className = "plot-tip";
  tip.setAttribute("role", "status");
  document.body.appendChild(tip);

  function hover(p: PanelState, event: MouseEvent, svg: SVGSVGElement): void {
    const point = svg.createSVGPoint();
    point.x = event.clientX;
    point.y = event.clientY;
    const m = svg.getScreenCTM();
    if (!m) return;
    const local = point.matrixTransform(m.inverse());
    const [x0, y0, w, h] = p.box;
    if (local.x < x0 || local.x > x0 + w || local.y < y0 || local.y > y0 + h || p.series.length === 0) {
      leave(p);
      return;
    }
    const v = xValue(p, local.x);
    const lines: string[] = [];
    let at = local.x;
    for (const s of p.series) {
      if (s.x.length === 0) continue;
      const i = nearest(p, s, v, local.x, local.y);
      if (i < 0) continue;
      const x = s.x[i] as number;
      const y = s.y[i] as number;
      if (!isFinite(y)) continue;
      at = xPixel(p, x, p.view);
      const name = s.name === "" ? "" : s.name + ": ";
      lines.push(`${name}${si(y, s.unit, 4)} at ${si(x, p.xUnit, 5)}`);
    }
    if (lines.length === 0) {
      leave(p);
      return;
    }
    if (!p.cross) {
      p.cross = svgElement("line", { class: "crosshair", y1: y0, y2: y0 + h, stroke: "currentColor", "stroke-width": 0.8, "pointer-events": "none" }) as SVGLineElement;
      p.g.appendChild(p.cross);
    }
    p.cross.setAttribute("x1", String(at));
    p.cross.setAttribute("x2", String(at));
    p.cross.style.display = "";
    tip.textContent = lines.join("\n");
    tip.style.display = "block";
    const left = Math.min(event.pageX + 14, window.scrollX + document.documentElement.clientWidth - tip.offsetWidth - 8);
    tip.style.left = `${left}px`;
    tip.style.top = `${event.pageY + 14}px`;
  }

  function leave(p: PanelState): void {
    tip.style.display = "none";
    if (p.cross) p.cross.style.display = "none";
  }

  function localX(svg: SVGSVGElement, clientX: number): number {
    const point = svg.createSVGPoint();
    point.x = clientX;
    const m = svg.getScreenCTM();
    return m ? point.matrixTransform(m.inverse()).x : clientX;
  }

  const groups: Record<string, PanelState[]> = {};
  const all: PanelState[] = [];
  document.querySelectorAll<HTMLElement>("figure.plot").forEach((figure) => {
    const svg = figure.querySelector("svg");
    if (!svg) return;
    const dataText = figure.querySelector("script.plot-data")?.textContent ?? "[]";
    const data = JSON.parse(dataText) as { name: string; unit: string; x: number[]; y: number[] }[][];
    const zoomable = figure.hasAttribute("data-zoom");
    const link = figure.getAttribute("data-link");
    svg.querySelectorAll<SVGGElement>("g.panel").forEach((g, index) => {
      const xs = numbers(g.getAttribute("data-x"));
      const ys = numbers(g.getAttribute("data-y"));
      const box = numbers(g.getAttribute("data-plot"));
      const series = (data[index] ?? []).map((s) => {
        let sorted = true;
        for (let i = 1; i < s.x.length && sorted; i++) if ((s.x[i] as number) < (s.x[i - 1] as number)) sorted = false;
        return { ...s, x: s.x.map(Number), y: s.y.map((v) => (v === null ? NaN : Number(v))), sorted };
      });
      const p: PanelState = {
        g,
        box: [box[0] ?? 0, box[1] ?? 0, box[2] ?? 1, box[3] ?? 1],
        base: [xs[0] ?? 0, xs[1] ?? 1],
        view: [xs[0] ?? 0, xs[1] ?? 1],
        xLog: / log$/.test(g.getAttribute("data-x") ?? ""),
        y: [ys[0] ?? 0, ys[1] ?? 1],
        yLog: / log$/.test(g.getAttribute("data-y") ?? ""),
        xUnit: g.getAttribute("data-x-unit") ?? "",
        yUnit: g.getAttribute("data-y-unit") ?? "",
        series,
        zoomable: zoomable && !/ log$/.test(g.getAttribute("data-x") ?? ""),
        group: [],
        cross: null,
      };
      const key = link ?? `figure-${all.length}`;
      (groups[key] = groups[key] ?? []).push(p);
      p.group = groups[key]!;
      all.push(p);
      svg.addEventListener("mousemove", (event) => hover(p, event, svg));
      svg.addEventListener("mouseleave", () => leave(p));
      if (!p.zoomable) return;
      g.classList.add("zoomable");
      svg.addEventListener(
        "wheel",
        (event) => {
          const x = localX(svg, event.clientX);
          if (x < p.box[0] || x > p.box[0] + p.box[2]) return;
          event.preventDefault();
          const factor = Math.pow(1.0015, event.deltaY);
          const v = xValue(p, x);
          setView(p, v - (v - p.view[0]) * factor, v + (p.view[1] - v) * factor);
        },
        { passive: false },
      );
      let dragFrom: { x: number; view: [number, number] } | null = null;
      svg.addEventListener("mousedown", (event) => {
        const x = localX(svg, event.clientX);
        if (x < p.box[0] || x > p.box[0] + p.box[2]) return;
        dragFrom = { x, view: [p.view[0], p.view[1]] };
        event.preventDefault();
      });
      window.addEventListener("mousemove", (event) => {
        if (!dragFrom) return;
        const shift = ((localX(svg, event.clientX) - dragFrom.x) / p.box[2]) * (dragFrom.view[1] - dragFrom.view[0]);
        setView(p, dragFrom.view[0] - shift, dragFrom.view[1] - shift);
      });
      window.addEventListener("mouseup", () => (dragFrom = null));
      svg.addEventListener("dblclick", () => setView(p, p.base[0], p.base[1]));
    });
    if (!zoomable) return;
    const bar = figure.querySelector(".zoom-bar");
    bar?.querySelectorAll<HTMLButtonElement>("button").forEach((button) => {
      button.addEventListener("click", () => {
        const first = all.find((p) => p.g.ownerSVGElement === svg && p.zoomable);
        if (!first) return;
        const [c0, c1] = first.view;
        const mid = (c0 + c1) / 2;
        const half = (c1 - c0) / 2;
        const action = button.getAttribute("data-action");
        if (action === "in") setView(first, mid - half / 2, mid + half / 2);
        else if (action === "out") setView(first, mid - half * 2, mid + half * 2);
        else if (action === "left") setView(first, c0 - half, c1 - half);
        else if (action === "right") setView(first, c0 + half, c1 + half);
        else setView(first, first.base[0], first.base[1]);
      });
    });
  });
  // A printed page shows every table, folded or not.
  window.addEventListener("beforeprint", () => document.querySelectorAll("details.more").forEach((d) => d.setAttribute("open", "")));
  // Tests and curious readers can see each panel's visible x range.
  (window as unknown as { onsetReport: unknown }).onsetReport = {
    panels: all.map((p) => ({ figure: p.g.closest("figure")?.id ?? "", view: () => [p.view[0], p.view[1]], points: p.series.reduce((n, s) => n + s.x.length, 0) })),
  };
}
