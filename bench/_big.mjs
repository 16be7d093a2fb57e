import { runSteady } from "@onset/core";
import { ladderOscillator } from "./ladder-oscillator.mjs";
const sections = Number(process.argv[2]);
const c = ladderOscillator(sections);
const t0 = Date.now();
try {
  const r = runSteady(c, { kind: "steady", probe: { kind: "node", node: "o" } }, { limits: { maxWallTime: Number(process.argv[3]) } });
  console.log("result", r.found, r.explanation.slice(0, 100));
} catch (e) { console.log("error", e.constructor.name, String(e.message).slice(0, 200)); }
console.log("s", (Date.now() - t0) / 1000);
