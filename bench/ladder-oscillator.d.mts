import type { Circuit, PartSpec } from "@onset/core";

/** An RC ladder with values varied over a 7- and a 5-section cycle, nodes `${prefix}0` … `${prefix}${sections}`. */
export function ladderParts(sections: number, prefix?: string): PartSpec[];

/** The ladder-network oscillator, `sections` long: sections + 11 unknowns (see ladder-oscillator.mjs). */
export function ladderOscillator(sections: number): Circuit;
