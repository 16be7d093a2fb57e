import type { Circuit } from "../circuit/circuit.js";
import type { Diagnostic } from "../circuit/diagnostic.js";
import { DEFAULT_RAILS } from "../devices/opamp.js";

/** A warning for every op-amp that limits at the default rails because it names none. */
export function defaultWarnings(circuit: Circuit): Diagnostic[] {
  return circuit.parts
    .filter((p) => p.kind === "opamp" && p.options.rails === undefined && p.options.supply === undefined)
    .map((p) => ({
      severity: "warning" as const,
      stage: "simulation" as const,
      code: "default-rails",
      message: `opamp ${p.name} has neither rails= nor supply=: it limits at the default rails (${DEFAULT_RAILS[0]}, ${DEFAULT_RAILS[1]}) V less its headroom`,
      ...(p.span ? { span: p.span } : {}),
      hint: "write rails=(neg, pos) for fixed supplies, or supply=(vneg, vpos) to follow two supply nodes",
    }));
}
