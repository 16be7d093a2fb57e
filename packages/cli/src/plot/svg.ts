/** Attribute values; `undefined` leaves the attribute out. */
export type Attributes = Readonly<Record<string, string | number | undefined>>;

// Characters XML 1.0 forbids outright (C0 controls other than tab, newline, return; lone
// surrogates; U+FFFE/U+FFFF): escaping cannot save them, so they are dropped.
const FORBIDDEN = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\ufffe\uffff]|[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/g;

const ENTITIES: Readonly<Record<string, string>> = { "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&apos;" };

/** Text made safe for XML content and attribute values. */
export function escapeXml(text: string): string {
  return text.replace(FORBIDDEN, "").replace(/[&<>"']/g, (c) => ENTITIES[c] ?? c);
}

/** A pixel coordinate to 0.1 px, which is below what a screen shows and keeps files small. */
export function px(value: number): string {
  const rounded = Math.round(value * 10) / 10;
  return Object.is(rounded, -0) ? "0" : String(rounded);
}

function attributeText(attributes: Attributes): string {
  let text = "";
  for (const [name, value] of Object.entries(attributes)) {
    if (value === undefined) continue;
    text += ` ${name}="${typeof value === "number" ? px(value) : escapeXml(value)}"`;
  }
  return text;
}

/** An element; `content` is markup already built (escape text with {@link escapeXml} or use {@link textElement}). */
export function element(name: string, attributes: Attributes, content?: string): string {
  const open = `<${name}${attributeText(attributes)}`;
  return content === undefined || content === "" ? `${open}/>` : `${open}>${content}</${name}>`;
}

/** A `<text>` element whose content is escaped. */
export function textElement(attributes: Attributes, text: string): string {
  return element("text", attributes, escapeXml(text));
}
