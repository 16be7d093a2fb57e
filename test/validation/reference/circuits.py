"""The validation circuits, transcribed by hand from their .onset files (values in SI units).

test/validation/circuits/*.onset for the seven validation cases, examples/*.onset for the three
examples. validation.test.ts checks this transcription against the project's own elaboration
of each file (part names, kinds, nodes and values), so the two cannot drift apart.
"""

from circuit import Circuit


def wien(c, r1, c1, r2, c2):
    c.resistor("R1", "o", "s", r1)
    c.capacitor("C1", "s", "p", c1)
    c.resistor("R2", "p", "gnd", r2)
    c.capacitor("C2", "p", "gnd", c2)


def antiparallel(c, a, b):
    """The usual limiting pair: D1 from a to b, D2 from b to a (default diodes)."""
    c.diode("D1", a, b)
    c.diode("D2", b, a)


def limited_feedback(c, rf1, rf2):
    """Feedback n → o through Rf1 then Rf2, with the diode pair across Rf2."""
    c.resistor("Rf1", "n", "f", rf1)
    c.resistor("Rf2", "f", "o", rf2)
    antiparallel(c, "f", "o")


def diode_limited_wien(title, r, cap, rg, rf1, rf2, **opamp):
    """Wien bridge (equal R, C) with gain 1 + (Rf1 + Rf2)/Rg and the diode pair across Rf2."""
    c = Circuit(title)
    wien(c, r, cap, r, cap)
    c.resistor("Rg", "n", "gnd", rg)
    limited_feedback(c, rf1, rf2)
    c.opamp("U1", "p", "n", "o", **opamp)
    return c


def wien_diode_2k():
    return diode_limited_wien("wien-diode-2k", 8.2e3, 10e-9, 10e3, 15e3, 6.8e3, preset="general")


def wien_diode_9k5():
    return diode_limited_wien("wien-diode-9k5", 3.4e3, 4.7e-9, 10e3, 15e3, 8.2e3, gain=200e3, gbw=1e6)


def wien_diode_ideal():
    return diode_limited_wien("wien-diode-ideal", 10e3, 10e-9, 4.7e3, 6.8e3, 3.3e3, gain=1e6, gbw=1e9, slew=float("inf"))


def wien_rail_clipped():
    c = Circuit("wien-rail-clipped")
    wien(c, 10.2e3, 10e-9, 10.2e3, 10e-9)
    c.resistor("Rg", "n", "gnd", 10e3)
    c.resistor("Rf", "n", "o", 21.5e3)
    c.opamp("U1", "p", "n", "o", preset="general", rails=(-12.0, 12.0))
    return c


def wien_rail_hard():
    c = Circuit("wien-rail-hard")
    wien(c, 10e3, 10e-9, 10e3, 10e-9)
    c.resistor("Rg", "n", "gnd", 10e3)
    c.resistor("Rf", "n", "o", 37e3)
    c.opamp("U1", "p", "n", "o", preset="general", rails=(-12.0, 12.0))
    return c


def cr_ladder(title, r, cap, rf1, rf2, **opamp):
    """Three C–R sections into an inverting stage (R3 its input resistor), diodes across Rf2."""
    c = Circuit(title)
    c.capacitor("C1", "o", "a", cap)
    c.resistor("R1", "a", "gnd", r)
    c.capacitor("C2", "a", "b", cap)
    c.resistor("R2", "b", "gnd", r)
    c.capacitor("C3", "b", "c", cap)
    c.resistor("R3", "c", "n", r)
    limited_feedback(c, rf1, rf2)
    c.opamp("U1", "gnd", "n", "o", **opamp)
    return c


def phase_shift_ladder():
    return cr_ladder("phase-shift-ladder", 10e3, 10e-9, 250e3, 68e3, preset="precision")


def twin_t():
    c = Circuit("twin-t")
    c.resistor("Ra", "o", "m1", 10e3)
    c.resistor("Rb", "m1", "t", 10e3)
    c.capacitor("Cs", "m1", "gnd", 20e-9)
    c.capacitor("Ca", "o", "m2", 10e-9)
    c.capacitor("Cb", "m2", "t", 10e-9)
    c.resistor("Rs", "m2", "gnd", 4.5e3)
    c.resistor("Rin", "t", "n", 47e3)
    limited_feedback(c, 1.3e6, 1.7e6)
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
    antiparallel(c, "f2", "o")
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
    return cr_ladder("cable-tracer", 5.36e3, 10e-9, 150e3, 33e3, preset="general", rails=(-9.0, 9.0))


# Case name (test/validation/cases.json) → builder.
BUILDERS = {
    "wien-diode-2k": wien_diode_2k,
    "wien-diode-9k5": wien_diode_9k5,
    "wien-diode-ideal": wien_diode_ideal,
    "wien-rail-clipped": wien_rail_clipped,
    "wien-rail-hard": wien_rail_hard,
    "phase-shift-ladder": phase_shift_ladder,
    "twin-t": twin_t,
    "bridge-excitation": bridge_excitation,
    "tuning-reference": tuning_reference,
    "cable-tracer": cable_tracer,
}
