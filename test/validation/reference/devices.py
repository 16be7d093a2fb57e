"""Device equations of the validation references, written from the documented models.

Sources: the doc comments of packages/core/src/devices/{opamp,diode,pot}.ts and docs/language.md
(defaults, presets). Written independently of the engine: no companion models, no MNA time
stepping; these are the device laws only, used by circuit.py to build state equations.

Units: SI throughout (V, A, ohm, F, s).
"""

import math

# Thermal voltage kT/q at 300.15 K with the exact SI 2019 constants (docs/references.md §7: 25.8649 mV).
BOLTZMANN = 1.380649e-23
ELEMENTARY_CHARGE = 1.602176634e-19
TEMPERATURE = 300.15
THERMAL_VOLTAGE = BOLTZMANN * TEMPERATURE / ELEMENTARY_CHARGE

# ---------------------------------------------------------------------------------------------
# Diode: Shockley law with emission n, saturation current Is, ohmic series resistance Rs and a
# 1e-12 S leak across the junction:
#     i(v) = Is·(exp(v/(n·Vt)) − 1) + 1e-12·v,     v = junction voltage (behind Rs)
# Past z = v/(n·Vt) = 40 the exponential continues along its tangent:
#     exp(z) → e^40·(1 + z − 40).
# Defaults (docs/language.md, Parts): saturation 2.5 nA, emission 1.8, series 0.5 ohm,
# junction capacitance 0 (none of the validation circuits sets one).
# ---------------------------------------------------------------------------------------------
DIODE_DEFAULTS = {"saturation": 2.5e-9, "emission": 1.8, "series": 0.5}
JUNCTION_LEAK = 1e-12
EXP_LIMIT = 40.0


def diode_current(v, saturation, nvt):
    """Junction current and its slope di/dv at junction voltage v."""
    z = v / nvt
    if z > EXP_LIMIT:
        e = math.exp(EXP_LIMIT)
        return saturation * (e * (1.0 + z - EXP_LIMIT) - 1.0) + JUNCTION_LEAK * v, saturation * e / nvt + JUNCTION_LEAK
    e = math.exp(z)
    return saturation * (e - 1.0) + JUNCTION_LEAK * v, saturation * e / nvt + JUNCTION_LEAK


# ---------------------------------------------------------------------------------------------
# Op-amp macromodel. One internal state x (the "pole node", a voltage):
#     Cp·dx/dt = i_in(vd) − x/Rp − i_clamp(x),       vd = v(plus) − v(minus) + vos
#     Rp = gain/gm, Cp = gm/(2π·gbw), gm = 1e-3 A/V (so gm·Rp = gain, Rp·Cp = gain/(2π·gbw))
#     i_in = gm·vd                                   without a slew limit (slew = inf)
#     i_in = Imax·tanh(gm·vd/Imax), Imax = slew·Cp    with one (dx/dt then cannot exceed slew)
# The output pin is x behind the output resistance rout (x is an ideal source: the output
# current does not load the pole equation). A resistance rin joins plus and minus (none when
# rin = inf).
# Rail clamps: hi = rails[1] − headroom, lo = rails[0] + headroom, knee width w,
#     gClamp = (slew·Cp if the slew is finite else gm·1 V)/w
#     i_clamp(x) = gClamp·softplus(x − hi, w) − gClamp·softplus(lo − x, w)
#     softplus(z, w) = w·ln(1 + e^(z/w)), taken as z when z/w > 30 and as w·e^(z/w) when
#     z/w < −30; its slope is the logistic 1/(1 + e^(−z/w)) (1, resp. e^(z/w), past ±30).
# Each clamp term is left out entirely more than 40 knee widths inside its limit
# (the engine's CLAMP_REACH: it would carry < 1e-17 of gClamp·w there).
# Presets (docs/language.md "Op-amp options"; packages/core/src/devices/opamp.ts):
# ---------------------------------------------------------------------------------------------
OPAMP_PRESETS = {
    "general": {"gain": 200e3, "gbw": 1e6, "slew": 0.5e6, "rout": 75.0, "rin": 2e6, "headroom": 1.5, "knee": 10e-3},
    "fast": {"gain": 100e3, "gbw": 10e6, "slew": 15e6, "rout": 50.0, "rin": 1e6, "headroom": 1.2, "knee": 10e-3},
    "precision": {"gain": 1e6, "gbw": 0.8e6, "slew": 0.3e6, "rout": 60.0, "rin": 30e6, "headroom": 1.0, "knee": 10e-3},
    "ideal": {"gain": 1e7, "gbw": 1e9, "slew": math.inf, "rout": 1e-3, "rin": math.inf, "headroom": 0.0, "knee": 1e-3},
}
OPAMP_DEFAULTS = dict(OPAMP_PRESETS["general"], vos=0.0, rails=(-15.0, 15.0))
STAGE_TRANSCONDUCTANCE = 1e-3
CLAMP_REACH = 40.0


def opamp_parameters(preset="general", **options):
    """The options of one op-amp: defaults, then the preset, then the written options."""
    p = dict(OPAMP_DEFAULTS)
    p.update(OPAMP_PRESETS[preset])
    p.update(options)
    gm = STAGE_TRANSCONDUCTANCE
    p["gm"] = gm
    p["r_pole"] = p["gain"] / gm
    p["c_pole"] = gm / (2 * math.pi * p["gbw"])
    p["i_max"] = p["slew"] * p["c_pole"] if math.isfinite(p["slew"]) else math.inf
    p["g_clamp"] = (p["i_max"] if math.isfinite(p["slew"]) else gm * 1.0) / p["knee"]
    p["high"] = p["rails"][1] - p["headroom"]
    p["low"] = p["rails"][0] + p["headroom"]
    return p


def softplus(z, w):
    u = z / w
    if u > 30:
        return z
    if u < -30:
        return w * math.exp(u)
    return w * math.log1p(math.exp(u))


def logistic(z, w):
    u = z / w
    if u > 30:
        return 1.0
    if u < -30:
        return math.exp(u)
    return 1.0 / (1.0 + math.exp(-u))


def opamp_input_current(vd, p):
    """i_in(vd) and its slope."""
    if math.isinf(p["i_max"]):
        return p["gm"] * vd, p["gm"]
    t = math.tanh(p["gm"] * vd / p["i_max"])
    return p["i_max"] * t, p["gm"] * (1.0 - t * t)


def opamp_clamp_current(x, p):
    """i_clamp(x) and its slope."""
    w, g = p["knee"], p["g_clamp"]
    i = di = 0.0
    if x - p["high"] > -CLAMP_REACH * w:
        i += g * softplus(x - p["high"], w)
        di += g * logistic(x - p["high"], w)
    if p["low"] - x > -CLAMP_REACH * w:
        i -= g * softplus(p["low"] - x, w)
        di += g * logistic(p["low"] - x, w)
    return i, di


# ---------------------------------------------------------------------------------------------
# Pot: a track of resistance R between end1 and end2 with a wiper at fraction `at` from end1:
# end1–wiper R·r, wiper–end2 R·(1 − r), r = at (linear) or (81^at − 1)/80 (audio); neither
# segment shorter than 1e-9·R. Default at = 0.5, linear.
# ---------------------------------------------------------------------------------------------
def pot_segments(total, at=0.5, taper="linear"):
    r = (81.0**at - 1.0) / 80.0 if taper == "audio" else at
    floor = total * 1e-9
    return max(total * r, floor), max(total * (1.0 - r), floor)
