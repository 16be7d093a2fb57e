export { formatSI, formatTickSI, withUnit } from "./si.js";
export type { SIFormatOptions } from "./si.js";
export { formatDecibel, formatPercent, formatPlain } from "./ratio.js";
export { formatWithError } from "./uncertain.js";
export { SI_PREFIXES, prefixExponentFor, prefixSymbol, siPrefixExponent, takesPrefix } from "./prefixes.js";
export { INFINITY_SIGN, MICRO_SIGN, MINUS_SIGN, NOT_A_NUMBER } from "./symbols.js";
