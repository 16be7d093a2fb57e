import { describe, expect, it } from "vitest";
import { element, escapeXml, px, textElement } from "../../../packages/cli/src/plot/svg.js";

describe("escapeXml(text)", () => {
  it("escapes the five XML special characters", () => {
    expect(escapeXml(`a<b & c>"d" 'e'`)).toBe("a&lt;b &amp; c&gt;&quot;d&quot; &apos;e&apos;");
  });

  it("drops characters XML 1.0 forbids and keeps tab, newline and astral characters", () => {
    expect(escapeXml("a\u0001b\u001fc\td\ne\ud835\udc9ff\ud800")).toBe("abc\td\ne\ud835\udc9ff");
  });

  it("does not escape twice", () => {
    expect(escapeXml("&amp;")).toBe("&amp;amp;");
  });
});

describe("px(value)", () => {
  it("rounds to a tenth of a pixel and never prints −0", () => {
    expect(px(12.345)).toBe("12.3");
    expect(px(-0.04)).toBe("0");
    expect(px(100)).toBe("100");
  });
});

describe("element(name, attributes, content)", () => {
  it("escapes attribute values, leaves out undefined ones and self-closes when empty", () => {
    expect(element("rect", { x: 1.25, title: 'a"b', fill: undefined })).toBe('<rect x="1.3" title="a&quot;b"/>');
    expect(textElement({ x: 0 }, "<&>")).toBe('<text x="0">&lt;&amp;&gt;</text>');
  });
});
