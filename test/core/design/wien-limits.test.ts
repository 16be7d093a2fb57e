import { describe, expect, test } from "vitest";
import { designOscillator, lampWienAmplitude, OnsetError, runStartup, startupAnalysisOf, thermistorWienAmplitude, type DesignedFile, type DesignOptions, type DesignRequest, type DesignResult } from "@onset/core";
import { elaborate, parseText, printDesignedFile } from "@onset/netlist-parser";
import { thrownBy } from "../../support/thrown.js";

function simulate(file: DesignedFile) {
  const { program, diagnostics } = parseText(printDesignedFile(file), "design.onset");
  expect(diagnostics).toEqual([]);
  const circuit = elaborate(program).circuit!;
  return runStartup(circuit, startupAnalysisOf(circuit)!);
}

/** The design and the text of the file it writes. */
function design(request: DesignRequest, options: DesignOptions): DesignResult & { readonly text: string } {
  const d = designOscillator(request, options);
  return { ...d, text: printDesignedFile(d.file) };
}

describe("onset design wien --limit lamp|thermistor|jfet", () => {
  test("lamp: Rf below 2.9·cold, the settled amplitude is the closed form's (docs/references.md §12.4) and fits the rails", () => {
    const d = design({ topology: "wien", frequency: 1000, limit: "lamp" }, { simulate });
    expect(d.text).toMatch(/^lamp +L1 +n +gnd +100 +hot=1k +rated=12 +tau=100m/m);
    const rf = Number(/^resistor +Rf +o +n +(\d+)±/m.exec(d.text)![1]);
    expect(1 + rf / 100).toBeGreaterThan(3.2);
    expect(1 + rf / 100).toBeLessThan(4);
    expect(d.simulated!.verdict).toBe("settled");
    expect(Math.abs(d.simulated!.amplitude! / lampWienAmplitude(rf) - 1)).toBeLessThan(0.02);
    expect(d.simulated!.amplitude!).toBeLessThan(0.8 * (12 - 1.5));
    expect(Math.abs(d.simulated!.error!)).toBeLessThan(0.02);
    expect(d.simulated!.thd!).toBeLessThan(1e-3);
  });

  test("thermistor: Rg for a cold gain near 3.6, amplitude as the closed form (docs/references.md §12.4)", () => {
    const d = design({ topology: "wien", frequency: 1000, limit: "thermistor" }, { simulate });
    expect(d.text).toMatch(/^thermistor +TH1 +o +n +10k +beta=3\.5k +dissipation=40u +tau=400m/m);
    const rg = Number(/^resistor +Rg +n +gnd +([\d.]+)k±/m.exec(d.text)![1]) * 1e3;
    expect(d.simulated!.verdict).toBe("settled");
    expect(Math.abs(d.simulated!.amplitude! / thermistorWienAmplitude(rg) - 1)).toBeLessThan(0.02);
    expect(d.text).toContain("startup probe=o until=6");
  });

  test("jfet: a JFET loop with a peak detector that settles near the target", () => {
    const d = design({ topology: "wien", frequency: 2000, limit: "jfet" }, { simulate });
    expect(d.text).toMatch(/^jfet +J1 +d +g +gnd +idss=8m +pinchoff=-2\.5/m);
    expect(d.text).toMatch(/^capacitor +Cf +c +gnd +1u±10%/m);
    expect(d.simulated!.verdict).toBe("settled");
    expect(Math.abs(d.simulated!.error!)).toBeLessThan(0.02);
    expect(d.simulated!.thd!).toBeLessThan(5e-3);
  });

  test("a limit other than diodes on another topology is an input error with a hint", () => {
    const e = thrownBy(OnsetError, () => designOscillator({ topology: "twin-t", frequency: 440, limit: "lamp" }));
    expect(e.diagnostic.code).toBe("bad-limit");
    expect(e.diagnostic.message).toBe("design: --limit lamp is for the Wien bridge; twin-t limits with diodes");
  });
});
