import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { escapeHtml, scriptJson, tag } from "../../../packages/cli/src/html/markup.js";

describe("scriptJson(value)", () => {
  // HTML ends a script element at the first "</script" whatever the JavaScript (HTML Living
  // Standard, script data state); JSON.parse of the text must still give the value back.
  test("never lets a string close its script element, and parses back to the value", () => {
    fc.assert(
      fc.property(fc.jsonValue(), (value) => {
        const text = scriptJson(value);
        expect(text.toLowerCase()).not.toContain("</script");
        expect(text).not.toContain("<");
        expect(JSON.parse(text)).toEqual(JSON.parse(JSON.stringify(value)));
      }),
    );
  });
});

describe("tag(name, attributes, content)", () => {
  test("escapes attribute values and leaves out undefined and false ones", () => {
    expect(tag("figure", { id: 'a"b', "data-zoom": false, hidden: true, title: undefined }, "x")).toBe('<figure id="a&quot;b" hidden>x</figure>');
  });

  test("escapeHtml leaves no markup character unescaped", () => {
    fc.assert(
      fc.property(fc.string(), (text) => {
        expect(escapeHtml(text)).not.toMatch(/[<>"']|&(?!(amp|lt|gt|quot|apos);)/);
      }),
    );
  });
});
