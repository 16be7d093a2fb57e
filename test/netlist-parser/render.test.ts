import { describe, expect, test } from "vitest";
import type { Diagnostic } from "@onset/core";
import { renderDiagnostic } from "@onset/netlist-parser";

const text = "resistor R1 a b 1k\n\tprobe=n2 x\n";
const sources = new Map([["twin.onset", text]]);
const d: Diagnostic = {
  severity: "error",
  stage: "input",
  code: "unknown-node",
  message: "unknown node 'n2' (did you mean 'n1'?)",
  span: { file: "twin.onset", start: 26, end: 28 },
  hint: "check the node name",
  notes: ["first note", "second note"],
};

describe("renderDiagnostic(d, sources, options)", () => {
  test("file:line:col, the source line, a caret under the span (tabs kept), the hint and the notes", () => {
    expect(renderDiagnostic(d, sources)).toBe(
      ["twin.onset:2:8: error: unknown node 'n2' (did you mean 'n1'?)", "  \tprobe=n2 x", "  \t      ^~", "hint: check the node name", "note: first note", "note: second note"].join("\n"),
    );
  });

  test("warnings say warning; a span reaching past the line is cut at the line end", () => {
    const w: Diagnostic = { severity: "warning", stage: "input", code: "x", message: "m", span: { file: "twin.onset", start: 16, end: 30 } };
    expect(renderDiagnostic(w, sources)).toBe(["twin.onset:1:17: warning: m", "  resistor R1 a b 1k", "                  ^~"].join("\n"));
  });

  test("no span: the message alone; an unknown file: file and message", () => {
    expect(renderDiagnostic({ severity: "error", stage: "input", code: "x", message: "cannot set 'Q'", hint: "h" }, sources)).toBe("error: cannot set 'Q'\nhint: h");
    expect(renderDiagnostic({ ...d, span: { file: "gone.onset", start: 0, end: 1 }, notes: [] }, sources)).toBe("gone.onset: error: unknown node 'n2' (did you mean 'n1'?)\nhint: check the node name");
  });

  test("an empty span gets one caret; a span at the end of the file points past the last character", () => {
    const at = (start: number, end: number) => renderDiagnostic({ severity: "error", stage: "input", code: "x", message: "m", span: { file: "f", start, end } }, new Map([["f", "abc"]]));
    expect(at(1, 1)).toBe("f:1:2: error: m\n  abc\n   ^");
    expect(at(3, 3)).toBe("f:1:4: error: m\n  abc\n     ^");
  });

  test("color: true colours the severity word and the caret, false is plain text", () => {
    const colored = renderDiagnostic(d, sources, { color: true });
    expect(colored).toContain("\u001b[1;31merror\u001b[0m");
    expect(colored.replace(/\u001b\[[0-9;]*m/g, "")).toBe(renderDiagnostic(d, sources));
    expect(renderDiagnostic(d, sources, { color: false })).not.toContain("\u001b");
  });
});
