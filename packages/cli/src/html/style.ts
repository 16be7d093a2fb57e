import { INK, SERIES_TONES } from "../plot/palette.js";

/**
 * The plots' colours on a dark page, keyed by the light colour the SVG was drawn with: CSS
 * outranks an SVG presentation attribute, so the same inline SVG serves both schemes (and
 * prints in its light colours).
 */
const DARK: Readonly<Record<string, string>> = {
  [INK.text]: "#e4e2dc",
  [INK.mutedText]: "#aaa8a2",
  [INK.axis]: "#8d8b86",
  [INK.frame]: "#4a4d55",
  [INK.grid]: "#363941",
  [INK.minorGrid]: "#2c2f36",
  [INK.zeroLine]: "#5d6069",
  [INK.background]: "#1d1f24",
  [INK.plot]: "#23262c",
  [INK.marker]: "#c9c6bf",
  [SERIES_TONES[0]!]: "#7fb2e0",
  [SERIES_TONES[1]!]: "#eba566",
  [SERIES_TONES[2]!]: "#a3c58c",
  [SERIES_TONES[3]!]: "#d48db0",
  [SERIES_TONES[4]!]: "#e3b3c8",
  [SERIES_TONES[5]!]: "#b9bf72",
};

function darkPlotRules(): string {
  return Object.entries(DARK)
    .map(([light, dark]) => `svg [fill="${light}"]{fill:${dark}} svg [stroke="${light}"]{stroke:${dark}}`)
    .join("\n");
}

/** The page's style sheet: a light and a dark scheme after the reader's preference, and print rules. */
export function pageStyle(): string {
  return `
:root{--paper:#f6f4ef;--card:#fffdf9;--ink:#24262b;--soft:#5e6168;--line:#dedbd3;--accent:#2d6a9f;--good:#2f7a4a;--warn:#9a6412;--bad:#a3323a;--code:#efece5;color-scheme:light dark}
@media (prefers-color-scheme:dark){:root{--paper:#17191d;--card:#1d1f24;--ink:#e4e2dc;--soft:#a9a7a1;--line:#363941;--accent:#7fb2e0;--good:#79c58f;--warn:#e0b060;--bad:#ee8a8f;--code:#2a2d33}
${darkPlotRules()}}
*{box-sizing:border-box}
body{margin:0;background:var(--paper);color:var(--ink);font:15px/1.5 system-ui,sans-serif}
header.page{padding:22px 28px 14px;border-bottom:3px solid var(--accent);background:var(--card)}
header.page h1{margin:0;font-size:24px;font-weight:650;letter-spacing:.01em}
header.page .file{color:var(--soft);font-family:ui-monospace,monospace;font-size:13px}
header.page .outcome{margin-top:6px}
main{max-width:1440px;margin:0 auto;padding:8px 20px 40px}
section.analysis{background:var(--card);border:1px solid var(--line);border-radius:10px;margin:18px 0;padding:6px 20px 16px}
h2{font-size:13px;text-transform:uppercase;letter-spacing:.12em;color:var(--soft);margin:14px 0 0}
h3{font-size:19px;margin:4px 0 6px;font-weight:620}
code{font-family:ui-monospace,monospace;font-size:.92em;background:var(--code);padding:1px 5px;border-radius:4px}
code.command{display:inline-block;white-space:pre-wrap;word-break:break-all;user-select:all}
p.explanation{margin:2px 0 10px;font-size:16px}
p.note{margin:4px 0;color:var(--soft);font-size:13px}
.verdict{display:inline-block;padding:1px 10px;border-radius:12px;font-size:.8em;font-weight:650;border:1.5px solid currentColor;vertical-align:2px}
.good{color:var(--good)} .warn{color:var(--warn)} .bad{color:var(--bad)} .muted{color:var(--soft)}
.tables{display:flex;flex-wrap:wrap;gap:10px 34px;align-items:flex-start;margin:8px 0}
table{border-collapse:collapse;font-variant-numeric:tabular-nums;font-size:14px}
table caption{text-align:left;font-weight:600;color:var(--soft);font-size:12.5px;padding-bottom:3px}
table.pairs th{text-align:left;font-weight:500;color:var(--soft);padding:2px 18px 2px 0}
table.pairs td{text-align:right;padding:2px 0}
table.data th{font-weight:600;font-size:12.5px;color:var(--soft);border-bottom:1.5px solid var(--line);padding:3px 10px;text-align:left}
table.data td{padding:3px 10px;border-bottom:1px solid var(--line)}
table.data .num{text-align:right}
details.more summary{cursor:pointer;color:var(--soft);font-size:12.5px;margin-top:4px}
ul.warnings{margin:6px 0;padding-left:20px} li.warning{color:var(--warn)} .hint{color:var(--soft)}
.plots{display:grid;grid-template-columns:repeat(6,minmax(0,1fr));gap:14px;margin:12px 0}
figure.plot{margin:0;grid-column:span 6;min-width:0;position:relative}
figure.plot.main{grid-column:span 4} figure.plot.side{grid-column:span 2} figure.plot.half{grid-column:span 3}
@media (max-width:900px){figure.plot.main,figure.plot.side,figure.plot.half{grid-column:span 6}}
figure.plot svg{display:block;width:100%;height:auto;border-radius:6px;border:1px solid var(--line)}
figure.plot figcaption{font-size:12.5px;color:var(--soft);margin-top:3px}
g.panel.zoomable{cursor:grab}
g.zoom *{vector-effect:non-scaling-stroke}
.zoom-bar{display:flex;flex-wrap:wrap;gap:4px;align-items:center;margin:0 0 4px}
.zoom-bar button{font:inherit;font-size:12px;padding:1px 9px;border:1px solid var(--line);border-radius:5px;background:var(--card);color:var(--ink);cursor:pointer}
.zoom-bar button:hover{border-color:var(--accent)}
.zoom-hint{font-size:11.5px;color:var(--soft);margin-left:6px}
.plot-tip{position:absolute;display:none;pointer-events:none;z-index:5;white-space:pre;background:var(--card);color:var(--ink);border:1px solid var(--accent);border-radius:6px;padding:4px 8px;font-size:12.5px;font-variant-numeric:tabular-nums;box-shadow:0 2px 8px rgba(0,0,0,.18)}
svg .crosshair{color:var(--soft)}
details.terminal summary{cursor:pointer;color:var(--soft);font-size:13px}
details.terminal pre{font-size:12.5px;overflow-x:auto;background:var(--code);padding:10px 12px;border-radius:6px}
footer{color:var(--soft);font-size:12px;text-align:center;padding:10px}
@media print{
 body{background:#fff;color:#000;font-size:11pt}
 header.page{border-bottom:2px solid #000}
 section.analysis{border:none;border-radius:0;padding:0;break-inside:auto}
 figure.plot{break-inside:avoid;grid-column:span 6 !important}
 .zoom-bar,.plot-tip,details.terminal{display:none}
 code{background:none;padding:0}
 table.data td,table.data th{border-color:#999}
}
`;
}
