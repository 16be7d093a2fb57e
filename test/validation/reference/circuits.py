"""The validation circuits, transcribed by hand from their .onset files (values in SI units).

test/validation/circuits/*.onset for the six validation cases, examples/*.onset for the three
examples. validation.test.ts checks this transcription against the project's own elaboration
of each file (part names, kinds, nodes and values), so the two cannot drift apart.
"""

from circuit import Circuit


def wien(c, r1, c1, r2, c2):
    c.resistor("R1", "o", "s", r1)
    c.capacitor("C1", "s", "p", c1)
    c.resistor("R2", "p", "gnd", r2)
    c.capacitor("C2", "p", "gnd", c2)


def wien_diode_2k():
    c = Circuit("wien-diode-2k")
    wien(c, 8.2e3, 10e-9, 8.2e3, 10e-9)
    c.resistor("Rg", "n", "gnd", 10e3)
    c.resistor("Rf1", "n", "f", 15e3)
    c.resistor("Rf2", "f", "o", 6.8e3)
    c.diode("D1", "f", "o")
    c.diode("D2", "o", "f")
    c.opamp("U1", "p", "n", "o", preset="general")
    return c


def wien_diode_9k5():
    c = Circuit("wien-diode-9k5")
    wien(c, 3.4e3, 4.7e-9, 3.4e3, 4.7e-9)
    c.resistor("Rg", "n", "gnd", 10e3)
    c.resistor("Rf1", "n", "f", 15e3)
    c.resistor("Rf2", "f", "o", 8.2e3)
    c.diode("D1", "f", "o")
    c.diode("D2", "o", "f")
    c.opamp("U1", "p", "n", "o", gain=200e3, gbw=1e6)
    return c


def wien_diode_ideal():
    c = Circuit("wien-diode-ideal")
    wien(c, 10e3, 10e-9, 10e3, 10e-9)
    c.resistor("Rg", "n", "gnd", 4.7e3)
    c.resistor("Rf1", "n", "f", 6.8e3)
    c.resistor("Rf2", "f", "o", 3.3e3)
    c.diode("D1", "f", "o")
    c.diode("D2", "o", "f")
    c.opamp("U1", "p", "n", "o", gain=1e6, gbw=1e9, slew=float("inf"))
    return c


def wien_rail_clipped():
    c = Circuit("wien-rail-clipped")
    wien(c, 10.2e3, 10e-9, 10.2e3, 10e-9)
    c.resistor("Rg", "n", "gnd", 10e3)
    c.resistor("Rf", "n", "o", 21.5e3)
    c.opamp("U1", "p", "n", "o", preset="general", rails=(-12.0, 12.0))
    return c


def phase_shift_ladder():
    c = Circuit("phase-shift-ladder")
    c.capacitor("C1", "o", "a", 10e-9)
    c.resistor("R1", "a", "gnd", 10e3)
    c.capacitor("C2", "a", "b", 10e-9)
    c.resistor("R2", "b", "gnd", 10e3)
    c.capacitor("C3", "b", "c", 10e-9)
    c.resistor("R3", "c", "n", 10e3)
    c.resistor("Rf1", "n", "f", 250e3)
    c.resistor("Rf2", "f", "o", 68e3)
    c.diode("D1", "f", "o")
    c.diode("D2", "o", "f")
    c.opamp("U1", "gnd", "n", "o", preset="precision")
    return c


def twin_t():
    c = Circuit("twin-t")
    c.resistor("Ra", "o", "m1", 10e3)
    c.resistor("Rb", "m1", "t", 10e3)
    c.capacitor("Cs", "m1", "gnd", 20e-9)
    c.capacitor("Ca", "o", "m2", 10e-9)
    c.capacitor("Cb", "m2", "t", 10e-9)
    c.resistor("Rs", "m2", "gnd", 4.5e3)
    c.resistor("Rin", "t", "n", 47e3)
    c.resistor("Rf1", "n", "f", 1.3e6)
    c.resistor("Rf2", "f", "o", 1.7e6)
    c.diode("D1", "f", "o")
    c.diode("D2", "o", "f")
    c.resistor("Rp1", "o", "p", 47e3)
    c.resistor("Rp2", "p", "gnd", 1e3)
    c.opamp("U1", "p", "n", "o", preset="fast")
    return c


def bridge_excitation():
    """examples/bridge-excitation.onset (tolerances play no part in a single run)."""
    c = Circuit("bridge-excitation")
    R, C = 13.7e3, 4.7e-9
    wien(c, R, C, R, C)
    c.resistor("Rg", "n", "gnd", 10e3)
    c.resistor("Rf1", "n", "f1", 13e3)
    c.pot("P1", "f1", "f2", "f2", 5e3, at=0.5)
    c.resistor("Rf2", "f2", "o", 5.6e3)
    c.diode("D1", "f2", "o")
    c.diode("D2", "o", "f2")
    c.opamp("U1", "p", "n", "o", preset="general", rails=(-12.0, 12.0))
    return c


def tuning_reference():
    """examples/tuning-reference.onset: the block `notch` used as N1 with R = 11.3k, k = 0.45."""
    c = Circuit("tuning-reference")
    R, C, k = 11.3e3, 33e-9, 0.45
    c.resistor("N1.Ra", "o", "N1.m1", R)
    c.resistor("N1.Rb", "N1.m1", "t", R)
    c.capacitor("N1.Cs", "N1.m1", "gnd", 2 * C)
    c.capacitor("N1.Ca", "o", "N1.m2", C)
    c.capacitor("N1.Cb", "N1.m2", "t", C)
    c.resistor("N1.Rs", "N1.m2", "gnd", k * R)
    c.resistor("Rin", "t", "n", 47e3)
    c.resistor("Rf1", "n", "f", 1.5e6)
    c.resistor("Rf2", "f", "o", 680e3)
    c.diode("D1", "f", "x1")
    c.diode("D2", "x1", "o")
    c.diode("D3", "o", "x2")
    c.diode("D4", "x2", "f")
    c.resistor("Rp1", "o", "p", 56e3)
    c.resistor("Rp2", "p", "gnd", 1e3)
    c.opamp("U1", "p", "n", "o", preset="general", rails=(-12.0, 12.0))
    return c


def cable_tracer():
    """examples/cable-tracer.onset."""
    c = Circuit("cable-tracer")
    R, C = 5.36e3, 10e-9
    c.capacitor("C1", "o", "a", C)
    c.resistor("R1", "a", "gnd", R)
    c.capacitor("C2", "a", "b", C)
    c.resistor("R2", "b", "gnd", R)
    c.capacitor("C3", "b", "c", C)
    c.resistor("R3", "c", "n", R)
    c.resistor("Rf1", "n", "f", 150e3)
    c.resistor("Rf2", "f", "o", 33e3)
    c.diode("D1", "f", "o")
    c.diode("D2", "o", "f")
    c.opamp("U1", "gnd", "n", "o", preset="general", rails=(-9.0, 9.0))
    return c


# Case name (test/validation/cases.json) → builder.
BUILDERS = {
    "wien-diode-2k": wien_diode_2k,
    "wien-diode-9k5": wien_diode_9k5,
    "wien-diode-ideal": wien_diode_ideal,
    "wien-rail-clipped": wien_rail_clipped,
    "phase-shift-ladder": phase_shift_ladder,
    "twin-t": twin_t,
    "bridge-excitation": bridge_excitation,
    "tuning-reference": tuning_reference,
    "cable-tracer": cable_tracer,
}
