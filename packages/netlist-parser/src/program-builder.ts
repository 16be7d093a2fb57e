import type { Circuit } from "@onset/core";
import type { Overrides } from "./elaborate/context.js";
import { elaborate } from "./elaborate/elaborate.js";
import type { Program } from "./syntax.js";

/** What {@link programBuilder} makes a study's builder from: plain data, so a worker thread can be sent a copy. */
export interface ProgramBuilderData {
  /** A program `loadProgram`, `loadSource` or `parseText` returned (or a structured copy of one). */
  readonly program: Program;
  /** Values every circuit takes before the study's own (`--set`). */
  readonly overrides?: Overrides;
}

/**
 * A tolerance study's builder from a parsed program: the program elaborated with
 * `data.overrides`, then the sample's values. Exported so that a worker thread can make it for
 * itself (`runToleranceStudy`'s `portable` option: `{ module: <this package's URL>, name:
 * "programBuilder", data }`). An elaboration error is thrown as a plain Error; the calling thread
 * then builds that sample itself and reports the error with its position.
 */
export function programBuilder(data: ProgramBuilderData): (values: Readonly<Record<string, number>>) => Circuit {
  if (typeof data !== "object" || data === null || typeof data.program !== "object" || data.program === null) throw new TypeError("programBuilder: data must be { program, overrides? }");
  return (values) => {
    const { circuit, diagnostics } = elaborate(data.program, { overrides: { ...data.overrides, ...values } });
    const error = diagnostics.find((d) => d.severity === "error");
    if (!circuit || error) throw new Error(error?.message ?? "the program did not elaborate");
    return circuit;
  };
}
