import { inputError } from "@onset/core";

/**
 * Bounds on what loading a circuit reads, so a file (or a stranger's text) cannot make the
 * loader read without end. Each is documented with its default in `docs/language.md`
 * ("Limits") and can be raised: `onset … --limit NAME=VALUE`, or these options.
 */
export interface SourceLimits {
  /**
   * Bytes of one source file (the top file and each include); reading stops here.
   * @defaultValue 4 000 000 (4 MB)
   */
  readonly maxSourceBytes?: number;
  /**
   * How deep includes nest: the top file's includes are depth 1, theirs depth 2, ….
   * @defaultValue 16
   */
  readonly maxIncludeDepth?: number;
  /**
   * Source files in one program, the top file included.
   * @defaultValue 100
   */
  readonly maxSourceFiles?: number;
  /**
   * Problems reported per file; past it one more says how many were left out ("and N more").
   * @defaultValue 100
   */
  readonly maxDiagnostics?: number;
  /**
   * How deep `use` lines nest: a block used at the top level is depth 1, a block it uses depth 2, ….
   * @defaultValue 64
   */
  readonly maxUseDepth?: number;
  /**
   * Parts and instances of the flattened circuit, each instance's own counted.
   * @defaultValue 250 000
   */
  readonly maxParts?: number;
  /**
   * How deep brackets (and function calls) nest in one expression.
   * @defaultValue 64
   */
  readonly maxExpressionDepth?: number;
  /**
   * Binary operators in one statement (they bound the depth of the trees evaluation walks).
   * @defaultValue 2000
   */
  readonly maxOperators?: number;
  /**
   * Longest chain of parameters reading parameters.
   * @defaultValue 256
   */
  readonly maxParameterDepth?: number;
}

/** The default {@link SourceLimits}. */
export const SOURCE_LIMITS: Readonly<Required<SourceLimits>> = {
  maxSourceBytes: 4_000_000,
  maxIncludeDepth: 16,
  maxSourceFiles: 100,
  maxDiagnostics: 100,
  maxUseDepth: 64,
  maxParts: 250_000,
  maxExpressionDepth: 64,
  maxOperators: 2000,
  maxParameterDepth: 256,
};

/** The command-line name of each source limit (`--limit source-size=10M`). */
export const SOURCE_LIMIT_FLAGS: Readonly<Record<keyof SourceLimits, string>> = {
  maxSourceBytes: "source-size",
  maxIncludeDepth: "include-depth",
  maxSourceFiles: "source-files",
  maxDiagnostics: "diagnostics",
  maxUseDepth: "use-depth",
  maxParts: "parts",
  maxExpressionDepth: "expression-depth",
  maxOperators: "operators",
  maxParameterDepth: "parameter-depth",
};

/** How to raise a source limit, from the command line and the API. */
export function raiseHint(limit: keyof SourceLimits, example: string): string {
  return `raise the limit with --limit ${SOURCE_LIMIT_FLAGS[limit]}=${example} (API: limits.${limit})`;
}

/** The limits with defaults filled in; a bad value is an `OnsetError` (`bad-limit`) naming it. */
export function sourceLimits(given: SourceLimits = {}): Required<SourceLimits> {
  const out = { ...SOURCE_LIMITS };
  for (const key of Object.keys(SOURCE_LIMITS) as Array<keyof SourceLimits>) {
    const value = given[key];
    if (value === undefined) continue;
    if (!(typeof value === "number" && (value === Infinity || (Number.isSafeInteger(value) && value > 0)))) {
      throw inputError("bad-limit", `limits.${key} must be a whole number above 0 (or Infinity), got ${String(value)}`);
    }
    out[key] = value;
  }
  return out;
}

/** Bytes of `text` in UTF-8, without encoding it. */
export function utf8Length(text: string): number {
  let bytes = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c < 0x80) bytes += 1;
    else if (c < 0x800) bytes += 2;
    else if (c >= 0xd800 && c <= 0xdbff && i + 1 < text.length) {
      bytes += 4;
      i++;
    } else bytes += 3;
  }
  return bytes;
}

/** A byte count as people read it: `4 MB`, `512 kB`, `900 bytes`. */
export function byteSize(bytes: number): string {
  if (bytes >= 1e6) return `${Number((bytes / 1e6).toPrecision(3))} MB`;
  if (bytes >= 1e3) return `${Number((bytes / 1e3).toPrecision(3))} kB`;
  return `${bytes} bytes`;
}

/** A byte count with its exact value when rounded: `12 kB (12000 bytes)`, `31 bytes`. */
export function exactSize(bytes: number): string {
  return bytes >= 1e3 ? `${byteSize(bytes)} (${bytes} bytes)` : byteSize(bytes);
}

/** The words of a `source-too-large` problem: the file, what was met, the limit and how to raise it. */
export function tooLargeWords(file: string, size: string, limit: number): { message: string; hint: string } {
  return { message: `'${file}' is ${size}, above the source-file size limit of ${byteSize(limit)}`, hint: raiseHint("maxSourceBytes", "10M") };
}
