import { escapeXml } from "../plot/svg.js";

/** Attribute values; `undefined` or `false` leaves the attribute out, `true` writes it bare. */
export type HtmlAttributes = Readonly<Record<string, string | number | boolean | undefined>>;

/** Text made safe for HTML content and attribute values. */
export function escapeHtml(text: string): string {
  return escapeXml(text);
}

/** An element; `content` is markup already built (escape text with {@link escapeHtml}). */
export function tag(name: string, attributes: HtmlAttributes, content = ""): string {
  let open = `<${name}`;
  for (const [key, value] of Object.entries(attributes)) {
    if (value === undefined || value === false) continue;
    open += value === true ? ` ${key}` : ` ${key}="${escapeHtml(String(value))}"`;
  }
  return `${open}>${content}</${name}>`;
}

/** An element holding plain text. */
export function textTag(name: string, attributes: HtmlAttributes, text: string): string {
  return tag(name, attributes, escapeHtml(text));
}

/** JSON safe inside a `<script>` element: no `<` can close it early. */
export function scriptJson(value: unknown): string {
  return JSON.stringify(value).replace(/</g, "\\u003c").replace(/\u2028/g, "\\u2028").replace(/\u2029/g, "\\u2029");
}
