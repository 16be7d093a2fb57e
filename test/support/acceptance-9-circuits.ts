// Acceptance pass 9's circuits that two test files share: the steady analysis' figures at the
// defaults (steady-acceptance-9) and at the cycles= and from= that once failed (steady-reach).

/** A JFET Colpitts: 100 µH (2 Ω) from gate to a 100 nF coupling capacitor, 2.2 nF and 10 nF to ground, a 10 mH choke from 12 V, 100k gate leak. */
export const COLPITTS = `vsource   Vd dd gnd 12
inductor  Lc dd d 10m
capacitor Cc d t 100n
inductor  L1 g t 100u series=2
capacitor C1 g gnd 2.2n
capacitor C2 d gnd 10n
resistor  Rg g gnd 100k
jfet      J1 d g gnd idss=10m pinchoff=-3`;

/** A voltage doubler (47 Ω, 10 µF, two diodes, 10 µF) on a 5 V, 1 kHz sine, loaded by RL. */
export const doubler = (load: string) => `vsource   V1 s gnd wave=sine amp=5 freq=1k
resistor  Rs s a 47
capacitor C1 a m 10u
diode     D1 gnd m saturation=1n emission=2 series=0
diode     D2 m k saturation=1n emission=2 series=0
capacitor C2 k gnd 10u
resistor  RL k gnd ${load}`;
