/** The kinds of token the lexer produces. */
export type TokenKind =
  | "name" // `Ra`, `max`, and dotted paths such as `N1.Ra` or `R1.i`
  | "number" // digits with optional fraction, exponent, SI prefix and unit, as one token
  | "string"
  | "equals"
  | "comma"
  | "lparen"
  | "rparen"
  | "lbracket"
  | "rbracket"
  | "plus"
  | "minus"
  | "star"
  | "slash"
  | "caret"
  | "plusminus" // `±` (the ASCII `+-` is two tokens, joined by the parser when adjacent)
  | "less"
  | "greater"
  | "range" // `..`
  | "newline"
  | "eof";

/** One token: its kind, its offsets in the file's text, and its text as written. */
export interface Token {
  readonly kind: TokenKind;
  readonly start: number;
  readonly end: number;
  readonly text: string;
  /** The decoded contents of a string token (escapes resolved). */
  readonly value?: string;
}

/** A `#` comment, kept for the formatter. */
export interface Comment {
  readonly start: number;
  readonly end: number;
  /** The comment as written, starting with `#`, without the line end. */
  readonly text: string;
}

/** How a token kind is named in messages. */
const tokenDescriptions: Readonly<Record<TokenKind, string>> = {
  name: "a name",
  number: "a number",
  string: "a string",
  equals: "'='",
  comma: "','",
  lparen: "'('",
  rparen: "')'",
  lbracket: "'['",
  rbracket: "']'",
  plus: "'+'",
  minus: "'-'",
  star: "'*'",
  slash: "'/'",
  caret: "'^'",
  plusminus: "'±'",
  less: "'<'",
  greater: "'>'",
  range: "'..'",
  newline: "the end of the line",
  eof: "the end of the file",
};

/** A token as quoted in a message: its text, or its description for line ends. */
export function describeToken(token: Token): string {
  if (token.kind === "newline" || token.kind === "eof") return tokenDescriptions[token.kind];
  return `'${token.text}'`;
}
