// Circuits of our own, large enough for the steady analysis' matrix-free shooting (60 unknowns
// and more), written out section by section. Each comment gives what an independent source says.

/**
 * `sections` buffered R–C lags (10 kΩ, 10 nF; each a follower on the general op-amp preset, slew
 * limit 0.5 V/µs) around an inverting stage whose gain, 1.25/cos(π/sections)^sections, is brought
 * down by back-to-back diodes across 40 % of its feedback resistor: each lag turns the phase by
 * π/sections at the oscillation. About 3 unknowns per section (20 sections: 66 unknowns).
 */
export function bufferedLagChain(sections: number, analyses: string): string {
  const gain = 1.25 / Math.cos(Math.PI / sections) ** sections;
  const lines = [
    `title "Buffered R-C lag chain, ${sections} sections"`,
    "param R = 10k",
    "param C = 10n",
    "block lag (i, o) R=(R) C=(C)",
    "  resistor  Rl i m   (R)",
    "  capacitor Cl m gnd (C)",
    "  opamp     Ub m o   o preset=general rails=(-12, 12)",
    "end",
  ];
  for (let k = 1; k <= sections; k++) lines.push(`use S${k} lag ${k === 1 ? "o" : `s${k - 1}`} s${k}`);
  lines.push(
    `resistor Rin s${sections} n 10k`,
    `resistor Rf1 n f ${(gain * 6).toFixed(3)}k`,
    `resistor Rf2 f o ${(gain * 4).toFixed(3)}k`,
    "diode    D1  f o",
    "diode    D2  o f",
    "opamp    U1  gnd n o preset=general rails=(-12, 12)",
  );
  return `${lines.join("\n")}\n${analyses}\n`;
}

/**
 * A 3 V, 2 kHz sine into a line of `sections` R–C sections (100 Ω, 1.5 nF), buffered by a
 * non-inverting stage of gain 3.2 into a diode pair behind 1 kΩ with 10 nF across it: a driven
 * circuit whose orbit has the source's period (70 sections: 78 unknowns).
 */
export function drivenLine(sections: number, analyses: string): string {
  const lines = ['title "Sine-driven R-C line into a diode limiter"', "vsource V1 in gnd wave=sine amp=3 freq=2k"];
  for (let k = 1; k <= sections; k++) lines.push(`resistor R${k} ${k === 1 ? "in" : `d${k - 1}`} d${k} 100`, `capacitor C${k} d${k} gnd 1.5n`);
  lines.push(
    `opamp     U1 d${sections} n o preset=general rails=(-12, 12)`,
    "resistor  Rg n gnd 1k",
    "resistor  Rf o n   2.2k",
    "resistor  Ro o q   1k",
    "diode     D1 q gnd",
    "diode     D2 gnd q",
    "capacitor Cq q gnd 10n",
  );
  return `${lines.join("\n")}\n${analyses}\n`;
}

/**
 * A lamp-stabilised Wien bridge (6.8 kΩ, 4.7 nF; Rf = 560 Ω over a lamp of 150 Ω cold, 1 kΩ hot
 * at 10 V, τ = 8 ms) whose two resistive arms are each split into `pieces` resistors with 2 pF
 * from every joint to ground (30 pieces: 64 unknowns). The shunts are 1e-3 of the Wien's C, so
 * the lamp still settles near Rf/2 (closed form: lampAmplitude of steady-circuits.ts).
 */
export function distributedLampWien(pieces: number, analyses: string): string {
  const lines = ['title "Lamp Wien with distributed arms"', "param R = 6.8k", "param C = 4.7n"];
  for (let k = 1; k <= pieces; k++) lines.push(`resistor Rs${k} ${k === 1 ? "o" : `t${k - 1}`} t${k} (R/${pieces})`, `capacitor Cs${k} t${k} gnd 2p`);
  lines.push(`capacitor C1 t${pieces} p (C)`);
  for (let k = 1; k <= pieces; k++) {
    lines.push(`resistor Rp${k} ${k === 1 ? "p" : `u${k - 1}`} ${k === pieces ? "gnd" : `u${k}`} (R/${pieces})`);
    if (k < pieces) lines.push(`capacitor Cp${k} u${k} gnd 2p`);
  }
  lines.push("capacitor C2 p gnd (C)", "resistor  Rf o n 560", "lamp      L1 n gnd 150 hot=1k rated=10 tau=8m", "opamp     U1 p n o preset=general rails=(-12, 12)");
  return `${lines.join("\n")}\n${analyses}\n`;
}

/**
 * A ladder of `sections` series resistors (150 Ω, varied over a 3-cycle) and shunt capacitors
 * (22 nF, varied over a 4-cycle) around an inverting stage of gain 30 (Rin = 150 kΩ), two diode
 * pairs across 70 % of its feedback resistor: about `sections` + 10 unknowns.
 */
export function resistiveLadder(sections: number, analyses: string): string {
  const lines = [`title "R-C ladder oscillator, ${sections} sections"`, "param C = 22n", "param R = 150"];
  for (let k = 1; k <= sections; k++) lines.push(`resistor R${k} ${k === 1 ? "o" : `a${k - 1}`} a${k} (${1 + (k % 3) / 10}*R)`, `capacitor C${k} a${k} gnd (${1 + (k % 4) / 10}*C)`);
  lines.push(
    `resistor Rin a${sections} n (1000*R)`,
    "resistor Rf1 n f  (9000*R)",
    "resistor Rf2 f o  (21000*R)",
    "diode    D1  f x1",
    "diode    D2  x1 o",
    "diode    D3  o x2",
    "diode    D4  x2 f",
    "opamp    U1  gnd n o preset=general rails=(-12, 12)",
  );
  return `${lines.join("\n")}\n${analyses}\n`;
}
