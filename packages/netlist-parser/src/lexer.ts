import type { Diagnostic } from "@onset/core";
import { problem } from "./errors.js";
import { statementWords } from "./keywords.js";
import type { Comment, Token, TokenKind } from "./tokens.js";

/** The tokens of one file, its comments, and the lexical problems found on the way. */
export interface LexResult {
  readonly tokens: Token[];
  readonly comments: Comment[];
  readonly diagnostics: Diagnostic[];
}

const SINGLE: Readonly<Record<string, TokenKind>> = {
  "=": "equals",
  ",": "comma",
  "(": "lparen",
  ")": "rparen",
  "[": "lbracket",
  "]": "rbracket",
  "+": "plus",
  "-": "minus",
  "*": "star",
  "/": "slash",
  "^": "caret",
  "±": "plusminus",
  "<": "less",
  ">": "greater",
};

/** Characters that may follow a number as its prefix and unit (`µ` and `μ`, `Ω` and the ohm sign). */
const SUFFIX_START = /[A-Za-z_µμΩ\u2126%]/;
const SUFFIX_REST = /[A-Za-z0-9_µμΩ\u2126%]/;
/**
 * The units with a `/`: a slew rate such as `V/us`, a noise density such as `nV/rtHz` or
 * `nV/√Hz`, a dissipation constant such as `mW/K`.
 */
const SLASH_UNIT = /^(?:[fpnuµμmkMGT]?V\/(?:[fpnuµμmkMGT]?s|rtHz|√Hz)|[fpnuµμmkMGT]?W\/K)(?![A-Za-z0-9_])/;
const NAME_START = /[A-Za-z_]/;
const NAME_REST = /[A-Za-z0-9_]/;

function isDigit(c: string | undefined): boolean {
  return c !== undefined && c >= "0" && c <= "9";
}

/**
 * Splits a file into tokens. A line end is a token unless it falls inside `( )` or `[ ]`
 * (implicit joining), except that a line starting with a statement word ends a bracket left
 * open, so one missing `)` cannot swallow the rest of the file.
 */
export function tokenize(text: string, file: string): LexResult {
  const tokens: Token[] = [];
  const comments: Comment[] = [];
  const diagnostics: Diagnostic[] = [];
  const openBrackets: number[] = [];
  const words = new Set(statementWords());
  let i = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  let badStart = -1;

  const flushBad = (end: number) => {
    if (badStart < 0) return;
    const chars = text.slice(badStart, end);
    diagnostics.push(
      problem("bad-character", `unexpected ${[...chars].length === 1 ? "character" : "characters"} ${showChars(chars)}`, { file, start: badStart, end }, {
        hint: badCharacterHint(chars),
      }),
    );
    badStart = -1;
  };
  const push = (kind: TokenKind, start: number, end: number, value?: string) => {
    flushBad(start);
    tokens.push(value === undefined ? { kind, start, end, text: text.slice(start, end) } : { kind, start, end, text: text.slice(start, end), value });
  };

  while (i < text.length) {
    const c = text[i]!;
    if (c === " " || c === "\t" || c === "\r") {
      flushBad(i);
      i++;
      continue;
    }
    if (c === "\n") {
      if (openBrackets.length === 0) push("newline", i, i + 1);
      else if (startsWithStatementWord(text, i + 1, words)) {
        flushBad(i);
        const at = openBrackets[0]!;
        diagnostics.push(
          problem("unclosed-bracket", `'${text[at]}' is not closed on this statement`, { file, start: at, end: at + 1 }, {
            hint: `add the closing '${text[at] === "(" ? ")" : "]"}' before the line ends`,
          }),
        );
        openBrackets.length = 0;
        push("newline", i, i + 1);
      } else flushBad(i);
      i++;
      continue;
    }
    if (c === "#") {
      flushBad(i);
      let end = text.indexOf("\n", i);
      if (end < 0) end = text.length;
      let stop = end;
      if (stop > i && text[stop - 1] === "\r") stop--;
      comments.push({ start: i, end: stop, text: text.slice(i, stop) });
      i = end;
      continue;
    }
    if (isDigit(c) || (c === "." && isDigit(text[i + 1]))) {
      const end = scanNumber(text, i);
      push("number", i, end);
      i = end;
      continue;
    }
    if (NAME_START.test(c)) {
      let end = i + 1;
      for (;;) {
        while (end < text.length && NAME_REST.test(text[end]!)) end++;
        if (text[end] === "." && end + 1 < text.length && NAME_START.test(text[end + 1]!)) end += 2;
        else break;
      }
      push("name", i, end);
      i = end;
      continue;
    }
    if (c === '"') {
      i = scanString(text, i, file, diagnostics, push);
      continue;
    }
    if (c === "." && text[i + 1] === ".") {
      push("range", i, i + 2);
      i += 2;
      continue;
    }
    const kind = SINGLE[c];
    if (kind) {
      push(kind, i, i + 1);
      if (c === "(" || c === "[") openBrackets.push(i);
      else if ((c === ")" || c === "]") && openBrackets.length > 0) openBrackets.pop();
      i++;
      continue;
    }
    if (badStart < 0) badStart = i;
    i += text.codePointAt(i)! > 0xffff ? 2 : 1;
  }
  flushBad(text.length);
  if (openBrackets.length > 0) {
    const at = openBrackets[0]!;
    diagnostics.push(
      problem("unclosed-bracket", `'${text[at]}' is not closed before the end of the file`, { file, start: at, end: at + 1 }, {
        hint: `add the closing '${text[at] === "(" ? ")" : "]"}'`,
      }),
    );
  }
  tokens.push({ kind: "eof", start: text.length, end: text.length, text: "" });
  return { tokens, comments, diagnostics };
}

/** End of the number starting at `start`: mantissa, exponent, then prefix/unit letters. */
function scanNumber(text: string, start: number): number {
  let i = start;
  while (isDigit(text[i])) i++;
  if (text[i] === "." && text[i + 1] !== ".") {
    i++;
    while (isDigit(text[i])) i++;
  }
  if (text[i] === "e" || text[i] === "E") {
    const j = text[i + 1] === "+" || text[i + 1] === "-" ? i + 2 : i + 1;
    if (isDigit(text[j])) {
      i = j;
      while (isDigit(text[i])) i++;
    }
  }
  const slash = SLASH_UNIT.exec(text.slice(i, i + 10));
  if (slash) return i + slash[0].length;
  if (i < text.length && SUFFIX_START.test(text[i]!)) {
    i++;
    while (i < text.length && SUFFIX_REST.test(text[i]!)) i++;
  }
  return i;
}

function scanString(
  text: string,
  start: number,
  file: string,
  diagnostics: Diagnostic[],
  push: (kind: TokenKind, start: number, end: number, value?: string) => void,
): number {
  let i = start + 1;
  let value = "";
  while (i < text.length && text[i] !== '"' && text[i] !== "\n") {
    if (text[i] === "\\") {
      const next = text[i + 1];
      if (next === '"' || next === "\\") {
        value += next;
        i += 2;
        continue;
      }
      diagnostics.push(
        problem("bad-escape", `unknown escape '\\${next === undefined || next === "\n" ? "" : next}' in a string`, { file, start: i, end: Math.min(i + 2, text.length) }, {
          hint: 'only \\" and \\\\ are escapes; write other characters as they are',
        }),
      );
      i++;
      continue;
    }
    value += text[i];
    i++;
  }
  if (text[i] === '"') {
    push("string", start, i + 1, value);
    return i + 1;
  }
  diagnostics.push(
    problem("unterminated-string", "string is not closed before the end of the line", { file, start, end: i }, {
      hint: 'end the string with " on the same line',
    }),
  );
  push("string", start, i, value);
  return i;
}

function startsWithStatementWord(text: string, from: number, words: ReadonlySet<string>): boolean {
  let i = from;
  while (text[i] === " " || text[i] === "\t") i++;
  const m = /^[A-Za-z_][A-Za-z0-9_]*/.exec(text.slice(i, i + 40));
  if (!m) return false;
  const after = text[i + m[0].length];
  return words.has(m[0]) && (after === undefined || after === " " || after === "\t" || after === "\n" || after === "\r" || after === "#");
}

function showChars(chars: string): string {
  const shown = [...chars].slice(0, 12).map((ch) => {
    const cp = ch.codePointAt(0)!;
    return cp < 0x20 || cp === 0x7f || (cp >= 0x80 && cp < 0xa0) || cp === 0xfffd ? `U+${cp.toString(16).toUpperCase().padStart(4, "0")}` : ch;
  });
  return `'${shown.join("")}'${[...chars].length > 12 ? "…" : ""}`;
}

function badCharacterHint(chars: string): string {
  const c = chars[0]!;
  if (c === "'" || c === "“" || c === "”") return 'strings use straight double quotes: "..."';
  if (c === ";" || c === ":") return "one statement per line; options are written key=value";
  if (c === "%") return "% follows a number directly, as in 5%";
  return "names use letters, digits and _, numbers look like 10k or 4.7n, and # starts a comment";
}
