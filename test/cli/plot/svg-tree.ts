import { XMLParser, XMLValidator } from "fast-xml-parser";

/** An element of a parsed SVG document. */
export interface SvgNode {
  readonly name: string;
  readonly attributes: Readonly<Record<string, string>>;
  readonly children: readonly SvgNode[];
  /** Text directly inside the element, entities decoded. */
  readonly text: string;
}

type Ordered = Record<string, unknown>;

function toNode(entry: Ordered): SvgNode | undefined {
  const name = Object.keys(entry).find((k) => k !== ":@");
  if (name === undefined || name === "#text" || name.startsWith("?")) return undefined;
  const raw = (entry[":@"] ?? {}) as Record<string, string>;
  const attributes: Record<string, string> = {};
  for (const [k, v] of Object.entries(raw)) attributes[k.replace(/^@_/, "")] = String(v);
  const content = (entry[name] ?? []) as Ordered[];
  const children = content.map(toNode).filter((n): n is SvgNode => n !== undefined);
  const text = content.filter((c) => "#text" in c).map((c) => String(c["#text"])).join("");
  return { name, attributes, children, text };
}

/** Validates with fast-xml-parser (throwing its message if invalid) and returns the root `<svg>`. */
export function parseSvg(svg: string): SvgNode {
  const verdict = XMLValidator.validate(svg);
  if (verdict !== true) throw new Error(`invalid XML: ${JSON.stringify(verdict.err)}`);
  const parser = new XMLParser({ preserveOrder: true, ignoreAttributes: false, parseTagValue: false, parseAttributeValue: false, trimValues: false });
  const document = parser.parse(svg) as Ordered[];
  const root = document.map(toNode).find((n) => n?.name === "svg");
  if (root === undefined) throw new Error("no <svg> root element");
  return root;
}

/** Every descendant (and the node itself) that satisfies `test`, in document order. */
export function findAll(node: SvgNode, test: (n: SvgNode) => boolean): SvgNode[] {
  const found: SvgNode[] = test(node) ? [node] : [];
  for (const child of node.children) found.push(...findAll(child, test));
  return found;
}

/** Descendants carrying a class. */
export function byClass(node: SvgNode, name: string): SvgNode[] {
  return findAll(node, (n) => (n.attributes.class ?? "").split(" ").includes(name));
}

/** Descendants with an element name. */
export function byName(node: SvgNode, name: string): SvgNode[] {
  return findAll(node, (n) => n.name === name);
}

/** The points of a `<polyline>` as [x, y] pairs. */
export function pointsOf(polyline: SvgNode): [number, number][] {
  return (polyline.attributes.points ?? "")
    .trim()
    .split(/\s+/)
    .map((p) => p.split(",").map(Number) as [number, number]);
}
