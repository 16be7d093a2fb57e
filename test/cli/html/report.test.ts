import { describe, expect, test } from "vitest";
import { outcomeHtml } from "../../../packages/cli/src/html/report.js";
import type { Outcome } from "../../../packages/cli/src/output/outcome.js";

// A spec checked without analyses: the page still says what the text report says.
const outcome: Outcome = { kind: "plain", runs: [], spec: { pass: false, on: "the first start-up", criteria: [{ text: "thd<3%", metric: "thd", measured: 0.045, pass: false }] } };

describe("outcomeHtml(subject, outcome, exit)", () => {
  const html = outcomeHtml({ file: "a <b>.onset", title: null, overrides: { R: "10k" } }, outcome, 1);

  test("is one document whose only script is inline and whose policy fetches nothing", () => {
    expect(html.startsWith("<!DOCTYPE html>\n")).toBe(true);
    expect(html).toContain(`content="default-src 'none'; style-src 'unsafe-inline'; script-src 'unsafe-inline'; img-src data:"`);
    expect(html.match(/<script/g)).toHaveLength(1);
  });

  test("escapes the file name and states the overrides, the spec outcome and the exit status", () => {
    expect(html).toContain("<title>a &lt;b&gt;.onset</title>");
    expect(html).toContain("set R=10k");
    expect(html).toContain('spec <span class="verdict bad">NOT met</span> <span class="muted">exit status 1</span>');
    expect(html).toContain('<td>thd&lt;3%</td><td class="num">4.5 %</td><td><span class="bad">FAIL</span></td>');
  });

  test("keeps the terminal's text report, without colour codes", () => {
    expect(html).toContain("no analyses to run: add one such as: startup probe=o");
    expect(html).not.toContain("\u001b[");
  });
});
