import { didYouMean, partKinds, type Diagnostic, type PartKindSchema } from "@onset/core";
import { isStackOverflow, raisedDiagnostic } from "./errors.js";
import { EACH, isAnalysisKeyword, statementWords } from "./keywords.js";
import { tokenize } from "./lexer.js";
import { ParserState, cover, sp, type ExpressionLimits } from "./parser-state.js";
import { SOURCE_LIMITS } from "./source-limits.js";
import { atOption, atValueStart, parseKey, parseOption, parseOptions, parseValue } from "./parse-values.js";
import type {
  AnalysisArg,
  AnalysisStatement,
  BlockParamNode,
  BlockStatement,
  CriterionNode,
  Identifier,
  PartStatement,
  Program,
  Span,
  SpecStatement,
  Statement,
  UseStatement,
} from "./syntax.js";
import { describeToken, type Token } from "./tokens.js";
import { madeProgram } from "./arguments.js";

/** Parses one file. Problems are collected per statement, so every independent error is reported. */
export function parseText(text: string, file: string, limits: ExpressionLimits = SOURCE_LIMITS): { program: Program; diagnostics: Diagnostic[] } {
  const lexed = tokenize(text, file);
  const state = new ParserState(lexed.tokens, file, limits);
  const statements = parseStatements(state, undefined);
  const diagnostics = [...lexed.diagnostics, ...state.diagnostics].sort((a, b) => (a.span?.start ?? 0) - (b.span?.start ?? 0));
  return { program: madeProgram({ file, text, statements, comments: lexed.comments }), diagnostics };
}

/** End offset of the last consumed token. */
function lastEnd(state: ParserState): number {
  return state.tokens[Math.max(0, state.pos - 1)]!.end;
}

function spanFrom(state: ParserState, first: Token | Span): Span {
  return { start: first.start, end: Math.max(first.start, lastEnd(state)) };
}

/** Statements up to the end of the file, or up to `end` inside the block whose header is `block`. */
function parseStatements(state: ParserState, block: Token | undefined): Statement[] {
  const statements: Statement[] = [];
  for (;;) {
    state.skipNewlines();
    const t = state.peek();
    if (t.kind === "eof") {
      if (block) state.diagnostics.push(unclosedBlock(state, block));
      return statements;
    }
    if (block && t.kind === "name" && t.text === "end") return statements;
    state.startStatement();
    const first = t;
    try {
      const statement = parseStatement(state, block !== undefined);
      if (statement) statements.push(statement);
      if (!state.atStatementEnd()) {
        const extra = state.peek();
        state.fail("unexpected", `unexpected ${describeToken(extra)} at the end of the statement`, extra, {
          hint: "one statement per line; options are written key=value",
        });
      }
    } catch (e) {
      const d = raisedDiagnostic(e) ?? (isStackOverflow(e) ? tooDeepForStack(state, first) : undefined);
      if (!d) throw e;
      state.diagnostics.push(d);
      state.skipStatement();
    }
  }
}

/** A statement whose nesting, within a raised expression-depth limit, ran past the stack. */
function tooDeepForStack(state: ParserState, first: Token): Diagnostic {
  return {
    severity: "error",
    stage: "input",
    code: "too-deep",
    message: "the statement nests too deep to parse within this machine's stack",
    span: state.span(first),
    hint: "split the expression with param lines (or lower a raised expression-depth limit)",
  };
}

function unclosedBlock(state: ParserState, block: Token): Diagnostic {
  const name = state.tokens[state.tokens.indexOf(block) + 1];
  const blockName = name?.kind === "name" ? ` '${name.text}'` : "";
  return {
    severity: "error",
    stage: "input",
    code: "unclosed-block",
    message: `block${blockName} has no 'end'`,
    span: state.span(block),
    hint: "close the block with a line holding only: end",
  };
}

function parseStatement(state: ParserState, inBlock: boolean): Statement | undefined {
  const t = state.peek();
  if (t.kind !== "name") {
    if (t.kind === "number" && state.peek(1).kind === "name") {
      return state.fail("unknown-kind", `a statement cannot start with ${describeToken(t)}`, t, {
        hint: "a part line starts with its kind, then its name: resistor R1 a b 10k",
      });
    }
    return state.fail("expected", `expected a statement, found ${describeToken(t)}`, t, {
      hint: "a line starts with a part kind (resistor, capacitor, …) or a statement word (param, block, transient, …)",
    });
  }
  const word = t.text;
  const topOnly = (what: string) => {
    if (inBlock) state.fail("not-in-block", `'${word}' cannot appear inside a block`, t, { hint: `write ${what} outside the block, at the top level of the file` });
  };
  switch (word) {
    case "title": {
      topOnly("the title");
      state.next();
      const s = state.expect("string", "the title in double quotes", 'write: title "My oscillator"');
      return { kind: "title", text: s.value ?? "", textSpan: sp(s), span: spanFrom(state, t) };
    }
    case "param": {
      state.next();
      const name = expectPlainName(state, "a parameter name");
      state.expect("equals", `'=' after the parameter name`, `write: param ${name.name} = 10k`);
      const value = parseValue(state, "the parameter's value");
      const each = state.peek().kind === "name" && state.peek().text === EACH ? sp(state.next()) : undefined;
      return { kind: "param", name: name.name, nameSpan: name.span, value, each: each !== undefined, ...(each ? { eachSpan: each } : {}), span: spanFrom(state, t) };
    }
    case "include": {
      topOnly("include");
      state.next();
      const s = state.expect("string", "a file path in double quotes", 'write: include "parts/amplifiers.onset"');
      return { kind: "include", path: s.value ?? "", pathSpan: sp(s), span: spanFrom(state, t) };
    }
    case "preset": {
      topOnly("presets");
      state.next();
      const name = expectPlainName(state, "a preset name");
      const kind = state.expect("name", "the part kind the preset is for", `write: preset ${name.name} opamp gbw=10M`);
      if (!partKinds[kind.text]) unknownKind(state, kind);
      const options = parseOptions(state);
      return { kind: "preset", name: name.name, nameSpan: name.span, partKind: kind.text, partKindSpan: sp(kind), options, span: spanFrom(state, t) };
    }
    case "block":
      topOnly("block definitions (blocks do not nest)");
      return parseBlock(state);
    case "end":
      return state.fail("stray-end", "'end' without a block to close", t, { hint: "remove this line, or start the block with: block NAME (ports)" });
    case "use":
      return parseUse(state);
  }
  if (isAnalysisKeyword(word)) {
    topOnly("analyses");
    return word === "spec" ? parseSpec(state) : parseAnalysis(state);
  }
  const schema = partKinds[word];
  if (schema) return parsePart(state, schema);
  return unknownKind(state, t);
}

function unknownKind(state: ParserState, t: Token): never {
  const kinds = Object.keys(partKinds);
  return state.fail("unknown-kind", `unknown part kind '${t.text}'${didYouMean(t.text, statementWords())}`, t, {
    hint: `a part line starts with its kind: ${kinds.join(", ")}`,
  });
}

/** A name without dots (parts, parameters, blocks, instances and nodes are written plain). */
function expectPlainName(state: ParserState, what: string): Identifier {
  const t = state.peek();
  if (t.kind === "number" && /^0+(\.0*)?$/.test(t.text) && what.includes("node")) nodeZero(state, t);
  const name = state.expect("name", what);
  if (name.text.includes(".")) {
    state.fail("dotted-name", `'${name.text}': ${what} cannot contain '.'`, name, {
      hint: "dots join hierarchical names (N1.Ra) and are made by use; write a plain name here",
    });
  }
  return { name: name.text, span: sp(name) };
}

function nodeZero(state: ParserState, t: Token): never {
  return state.fail("node-zero", "node '0' is not ground in this language", t, { hint: "write gnd for the ground node" });
}

/** A node in a pin position: a plain name, `0` is reported with a hint to write `gnd`. */
function parseNode(state: ParserState, what: string): Identifier {
  const t = state.peek();
  if (t.kind === "number" && /^0+(\.0*)?$/.test(t.text)) nodeZero(state, t);
  return expectPlainName(state, what);
}

/** part := KIND NAME pin… [value] option… — the kind's schema says how many pins. */
function parsePart(state: ParserState, schema: PartKindSchema): PartStatement {
  const kind = state.next();
  const name = expectPlainName(state, "a part name");
  const label = `${schema.kind} ${name.name}`;
  const pinList = schema.pins.join(", ");
  const pins: Identifier[] = [];
  for (let i = 0; i < schema.pins.length; i++) {
    const t = state.peek();
    const isZero = t.kind === "number" && /^0+(\.0*)?$/.test(t.text);
    if ((t.kind !== "name" || atOption(state)) && !isZero) {
      state.fail("pin-count", `${label} has ${schema.pins.length} pins (${pinList}), but ${i} ${i === 1 ? "is" : "are"} written`, t, {
        hint: `write ${schema.pins.length} node names after the part name`,
      });
    }
    pins.push(parseNode(state, `a node name for pin ${schema.pins[i]}`));
  }
  if (state.at("name") && !atOption(state)) {
    const first = state.peek();
    let count = pins.length;
    let last = first;
    while (state.at("name") && !atOption(state)) {
      last = state.next();
      count++;
    }
    state.fail("pin-count", `${label} has ${schema.pins.length} pins (${pinList}), but ${count} are written`, cover(first, last), {
      hint: schema.value ? `the value follows the ${schema.pins.length} nodes; a value is a number or an expression in ( )` : `remove the extra ${count - pins.length === 1 ? "node" : "nodes"}`,
    });
  }
  let value;
  if (atValueStart(state) && !atOption(state)) {
    if (!schema.value) {
      state.fail("unexpected-value", `${label} takes no value after its pins`, state.peek(), {
        hint: `set ${schema.kind} parameters as options, e.g. ${Object.keys(schema.options).filter((k) => k !== "preset")[0] ?? "key"}=…`,
      });
    }
    value = parseValue(state, "the part's value");
  }
  const options = parseOptions(state);
  const base = { kind: "part", partKind: kind.text, partKindSpan: sp(kind), name: name.name, nameSpan: name.span, pins, options, span: spanFrom(state, kind) } as const;
  return value ? { ...base, value } : base;
}

/** use := 'use' NAME BLOCK node… param=value… */
function parseUse(state: ParserState): UseStatement {
  const word = state.next();
  const name = expectPlainName(state, "an instance name");
  const block = expectPlainName(state, "the name of the block to use");
  const nodes: Identifier[] = [];
  while (!state.atStatementEnd() && !atOption(state)) nodes.push(parseNode(state, "a node name"));
  const params = parseOptions(state);
  return { kind: "use", name: name.name, nameSpan: name.span, block: block.name, blockSpan: block.span, nodes, params, span: spanFrom(state, word) };
}

/** block := 'block' NAME '(' ports ')' param… NEWLINE statement… 'end' */
function parseBlock(state: ParserState): BlockStatement | undefined {
  const word = state.next();
  let header: { name: Identifier; ports: Identifier[]; params: BlockParamNode[] } | undefined;
  try {
    const name = expectPlainName(state, "a block name");
    state.expect("lparen", "'(' and the block's ports", `write: block ${name.name} (in, out, ref)`);
    const ports: Identifier[] = [];
    if (!state.at("rparen")) {
      do {
        const port = parseNode(state, "a port name");
        if (port.name === "gnd") state.fail("ground-port", "gnd cannot be a port: it is the same node everywhere", port.span, { hint: "remove gnd from the ports; parts inside the block reach gnd directly" });
        ports.push(port);
      } while (state.eat("comma"));
    }
    state.expect("rparen", "')' or ','");
    const params: BlockParamNode[] = [];
    while (!state.atStatementEnd()) {
      const p = expectPlainName(state, "a block parameter name");
      if (state.eat("equals")) {
        const value = parseValue(state, `a default for ${p.name}`);
        params.push({ name: p.name, nameSpan: p.span, value, span: cover(p.span, value.span) });
      } else params.push({ name: p.name, nameSpan: p.span, span: p.span });
    }
    header = { name, ports, params };
  } catch (e) {
    const d = raisedDiagnostic(e);
    if (!d) throw e;
    state.diagnostics.push(d);
    state.skipStatement();
  }
  const headerSpan = spanFrom(state, word);
  const body = parseStatements(state, word);
  const end = state.peek();
  if (end.kind === "name" && end.text === "end") {
    state.next();
    if (!state.atStatementEnd()) {
      const extra = state.peek();
      state.diagnostics.push({
        severity: "error",
        stage: "input",
        code: "unexpected",
        message: `unexpected ${describeToken(extra)} after 'end'`,
        span: state.span(extra),
        hint: "'end' stands alone on its line",
      });
      state.skipStatement();
    }
  }
  if (!header) return undefined;
  return {
    kind: "block",
    name: header.name.name,
    nameSpan: header.name.span,
    ports: header.ports,
    params: header.params,
    body,
    headerSpan,
    endSpan: sp(end),
    span: spanFrom(state, word),
  };
}

/** analysis := KEYWORD [target] (option | flag)… */
function parseAnalysis(state: ParserState): AnalysisStatement {
  const word = state.next();
  const analysis = word.text as AnalysisStatement["analysis"];
  let target: Identifier | undefined;
  if (analysis === "sweep") {
    if (!state.at("name") || atOption(state)) {
      state.fail("expected", `expected what to sweep, found ${describeToken(state.peek())}`, state.peek(), {
        hint: "write the target first: sweep R from=10k to=12k steps=5",
      });
    }
    const t = state.next();
    target = { name: t.text, span: sp(t) };
  }
  const args: AnalysisArg[] = [];
  while (!state.atStatementEnd()) {
    if (atOption(state)) args.push({ kind: "option", ...parseOption(state) });
    else if (state.at("name")) {
      const t = state.next();
      args.push({ kind: "flag", name: t.text, span: sp(t) });
    } else {
      const t = state.peek();
      state.fail("expected", `expected an option key=value, found ${describeToken(t)}`, t, { hint: `options of ${analysis} are written key=value` });
    }
  }
  const base = { kind: "analysis", analysis, keywordSpan: sp(word), args, span: spanFrom(state, word) } as const;
  return target ? { ...base, target } : base;
}

/** spec := 'spec' criterion…, criterion := metric ('=' value ['..' value] | '<' value | '>' value) */
function parseSpec(state: ParserState): SpecStatement {
  const word = state.next();
  const criteria: CriterionNode[] = [];
  while (!state.atStatementEnd()) {
    const metric = parseKey(state, "a metric name");
    const opToken = state.peek();
    const op: CriterionNode["op"] | undefined = opToken.kind === "equals" ? "=" : opToken.kind === "less" ? "<" : opToken.kind === "greater" ? ">" : undefined;
    if (!op) {
      state.fail("expected", `expected '=', '<' or '>' after '${metric.name}', found ${describeToken(opToken)}`, opToken, {
        hint: "write criteria such as frequency=1k±2%, thd<0.5% or amplitude=3..5",
      });
    }
    state.next();
    const value = parseValue(state, `a limit for ${metric.name}`);
    let high;
    if (op === "=" && state.eat("range")) high = parseValue(state, "the upper end of the range");
    const base: CriterionNode = { metric: metric.name, metricSpan: metric.span, op, value, span: spanFrom(state, metric.span) };
    criteria.push(high ? { ...base, high } : base);
  }
  if (criteria.length === 0) {
    state.fail("expected", "spec needs at least one criterion", word, { hint: "write e.g.: spec frequency=1k±2% thd<0.5%" });
  }
  return { kind: "spec", criteria, span: spanFrom(state, word) };
}
