/**
 * Offline checks of manifest.xml (`office-addin-manifest validate` posts to an online
 * service, so it cannot run here). Sources of the rules:
 * - XML 1.0 (W3C Recommendation, 5th ed.): well-formedness as fast-xml-parser's validator checks
 *   it (tag balance and unique, quoted attributes, §3.1; no bare '&', §4.1), plus one root
 *   element and no text outside it (§2.1), checked here; Namespaces in XML 1.0 (W3C): every
 *   prefix used is declared, checked here on the parsed tree.
 * - The Office add-in manifest schema as summarised in docs/OFFICE-NOTES.md: element
 *   order of OfficeApp, Hosts/Workbook, ReadWriteDocument, VersionOverrides V1_0,
 *   ShowTaskpane, icon sizes 16/32/80, short strings <= 125 and long strings <= 250 chars.
 * - RFC 4122 (GUID text form 8-4-4-4-12 hex digits).
 * - PNG specification (W3C 2003) §11.2.2: IHDR is the first chunk; width and height are
 *   big-endian 32-bit integers at byte offsets 16 and 20 of the file.
 */
import { describe, expect, it } from "vitest";
import { existsSync, readFileSync } from "node:fs";
import { XMLParser, XMLValidator } from "fast-xml-parser";
import { fileURLToPath } from "node:url";

const ROOT = fileURLToPath(new URL("../../", import.meta.url));
const MANIFEST_TEXT = readFileSync(`${ROOT}manifest.xml`, "utf8");

interface XmlElement {
  readonly name: string;
  readonly attrs: ReadonlyMap<string, string>;
  readonly children: XmlElement[];
  text: string;
}

describe("XML well-formedness check (fast-xml-parser plus root and namespace checks; XML 1.0, W3C)", () => {
  const bad: [string, string][] = [
    ["unclosed element", "<a><b></a>"],
    ["mismatched end tag", "<a></b>"],
    ["unquoted attribute", "<a x=1/>"],
    ["duplicate attribute", '<a x="1" x="2"/>'],
    ["bare ampersand", "<a>fish & chips</a>"],
    ["two root elements", "<a/><b/>"],
    ["text after the root", "<a/>text"],
    ["undeclared namespace prefix", "<a><bt:b/></a>"],
  ];
  for (const [why, xml] of bad) {
    it(`rejects ${why}`, () => expect(() => parseXml(xml)).toThrow());
  }
  it("accepts entities, character references, comments and a declaration", () => {
    const root = parseXml('<?xml version="1.0"?><!-- c --><a xmlns:p="urn:x" v="&lt;&#65;&#x42;"><p:b>&amp;</p:b></a>');
    expect(root.attrs.get("v")).toBe("<AB");
    expect(root.children[0]?.text).toBe("&");
  });
});

describe("manifest.xml (Office add-in manifest rules, OFFICE-NOTES.md)", () => {
  const root = parseXml(MANIFEST_TEXT);
  const all = flatten(root);
  const child = (el: XmlElement, name: string): XmlElement | undefined => el.children.find((c) => c.name === name);

  it("is a TaskPaneApp OfficeApp in the 1.1 namespace", () => {
    expect(root.name).toBe("OfficeApp");
    expect(root.attrs.get("xmlns")).toBe("http://schemas.microsoft.com/office/appforoffice/1.1");
    expect(root.attrs.get("xsi:type")).toBe("TaskPaneApp");
  });

  it("has the required top-level elements in the enforced order", () => {
    const order = [
      "Id",
      "AlternateID",
      "Version",
      "ProviderName",
      "DefaultLocale",
      "DisplayName",
      "Description",
      "IconUrl",
      "HighResolutionIconUrl",
      "SupportUrl",
      "AppDomains",
      "Hosts",
      "Requirements",
      "DefaultSettings",
      "Permissions",
      "VersionOverrides",
    ];
    const names = root.children.map((c) => c.name);
    for (const n of names) expect(order, `unexpected element ${n}`).toContain(n);
    const ranks = names.map((n) => order.indexOf(n));
    expect(ranks).toEqual([...ranks].sort((a, b) => a - b));
    for (const required of order.filter((n) => n !== "AlternateID")) expect(names).toContain(required);
  });

  it("has an RFC 4122 GUID as Id that is not all zeros, and version 1.0.0.0", () => {
    const id = child(root, "Id")?.text.trim() ?? "";
    expect(id).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i);
    expect(id.replace(/[-0]/g, "")).not.toBe("");
    expect(child(root, "Version")?.text.trim()).toBe("1.0.0.0");
  });

  it("names the provider and the add-in, within the length limits", () => {
    expect(child(root, "ProviderName")?.text.trim()).toBe("Kiln Route Planner contributors");
    expect(child(root, "DisplayName")?.attrs.get("DefaultValue")).toBe("Kiln Route Planner");
    expect((child(root, "DisplayName")?.attrs.get("DefaultValue") ?? "").length).toBeLessThanOrEqual(125);
    const description = child(root, "Description")?.attrs.get("DefaultValue") ?? "";
    expect(description.length).toBeGreaterThan(0);
    expect(description.length).toBeLessThanOrEqual(250);
  });

  it("targets workbooks, asks for ExcelApi 1.4 and read/write document access", () => {
    const host = child(child(root, "Hosts")!, "Host");
    expect(host?.attrs.get("Name")).toBe("Workbook");
    const set = flatten(child(root, "Requirements")!).find((e) => e.name === "Set");
    expect(set?.attrs.get("Name")).toBe("ExcelApi");
    expect(set?.attrs.get("MinVersion")).toBe("1.4");
    expect(child(root, "Permissions")?.text.trim()).toBe("ReadWriteDocument");
    expect(child(child(root, "DefaultSettings")!, "SourceLocation")?.attrs.get("DefaultValue")).toBe(
      "https://localhost:3000/taskpane.html?kiln-host=office",
    );
  });

  it("uses HTTPS for every URL", () => {
    const urls: string[] = [];
    for (const el of all) {
      for (const [k, v] of el.attrs) if (/^[a-z]+:\/\//i.test(v) && !k.startsWith("xmlns")) urls.push(v);
      if (/^[a-z]+:\/\//i.test(el.text.trim())) urls.push(el.text.trim());
    }
    expect(urls.length).toBeGreaterThan(5);
    for (const u of urls) expect(u, u).toMatch(/^https:\/\//);
  });

  it("has VersionOverrides V1_0 with a ShowTaskpane button in a Home-tab group", () => {
    const vo = child(root, "VersionOverrides")!;
    expect(vo.attrs.get("xsi:type")).toBe("VersionOverridesV1_0");
    const tab = flatten(vo).find((e) => e.name === "OfficeTab");
    expect(tab?.attrs.get("id")).toBe("TabHome");
    const button = flatten(tab!).find((e) => e.name === "Control");
    expect(button?.attrs.get("xsi:type")).toBe("Button");
    expect(
      flatten(button!)
        .find((e) => e.name === "Action")
        ?.attrs.get("xsi:type"),
    ).toBe("ShowTaskpane");
  });

  it("defines every referenced resid exactly once in Resources, each within its length limit", () => {
    const resources = child(child(root, "VersionOverrides")!, "Resources")!;
    const defined = new Map<string, { kind: string; value: string }>();
    for (const group of resources.children) {
      for (const item of group.children) {
        const id = item.attrs.get("id") ?? "";
        expect(defined.has(id), `duplicate id ${id}`).toBe(false);
        defined.set(id, { kind: group.name, value: item.attrs.get("DefaultValue") ?? "" });
      }
    }
    const referenced = all.map((e) => e.attrs.get("resid")).filter((r): r is string => r !== undefined);
    expect(referenced.length).toBeGreaterThan(5);
    for (const r of referenced) expect(defined.has(r), `resid ${r} is not defined`).toBe(true);
    for (const [id, { kind, value }] of defined) {
      expect(value.length, id).toBeGreaterThan(0);
      if (kind === "bt:ShortStrings") expect(value.length, id).toBeLessThanOrEqual(125);
      if (kind === "bt:LongStrings") expect(value.length, id).toBeLessThanOrEqual(250);
    }
  });

  it("keeps resource ids within 32 characters and control, group and resource ids unique (manifest reference, from memory)", () => {
    const ids = all.map((e) => e.attrs.get("id")).filter((v): v is string => v !== undefined && v !== "TabHome");
    expect(new Set(ids).size).toBe(ids.length);
    for (const id of ids) expect(id.length, id).toBeLessThanOrEqual(32);
  });

  it("references icon files that exist in assets/ at the declared pixel sizes (PNG IHDR)", () => {
    const resources = child(child(root, "VersionOverrides")!, "Resources")!;
    const images = new Map(
      child(resources, "bt:Images")!.children.map((i) => [i.attrs.get("id") ?? "", i.attrs.get("DefaultValue") ?? ""]),
    );
    const wanted: [string, number][] = [
      [child(root, "IconUrl")!.attrs.get("DefaultValue")!, 32],
      [child(root, "HighResolutionIconUrl")!.attrs.get("DefaultValue")!, 64],
    ];
    for (const img of all.filter((e) => e.name === "bt:Image" && e.attrs.has("resid"))) {
      wanted.push([images.get(img.attrs.get("resid")!)!, Number(img.attrs.get("size"))]);
    }
    expect(new Set(wanted.map(([, s]) => s))).toEqual(new Set([16, 32, 64, 80]));
    for (const [url, size] of wanted) {
      const path = new URL(url).pathname;
      expect(path).toMatch(/^\/assets\/[\w.-]+\.png$/);
      const file = `${ROOT}${path.slice(1)}`;
      expect(existsSync(file), file).toBe(true);
      expect(pngSize(readFileSync(file)), path).toEqual({ width: size, height: size });
    }
  });
});

function flatten(el: XmlElement): XmlElement[] {
  return [el, ...el.children.flatMap(flatten)];
}

function pngSize(bytes: Buffer): { width: number; height: number } {
  const signature = [137, 80, 78, 71, 13, 10, 26, 10];
  if (!signature.every((b, i) => bytes[i] === b)) throw new Error("not a PNG file");
  if (bytes.toString("latin1", 12, 16) !== "IHDR") throw new Error("IHDR is not the first chunk");
  return { width: bytes.readUInt32BE(16), height: bytes.readUInt32BE(20) };
}

/** The XML parser's options: attributes kept as written (no prefix, no number parsing), document order kept. */
const XML_OPTIONS = {
  preserveOrder: true,
  ignoreAttributes: false,
  attributeNamePrefix: "",
  parseTagValue: false,
  parseAttributeValue: false,
  trimValues: false,
  htmlEntities: true,
  ignoreDeclaration: true,
  commentPropName: "#comment",
} as const;

type XmlNode = Record<string, unknown>;

/**
 * Parse XML with fast-xml-parser after its validator, then check what it leaves out: one root
 * element, no text outside it, every namespace prefix declared. Throws on the first error.
 */
function parseXml(xml: string): XmlElement {
  const valid = XMLValidator.validate(xml);
  if (valid !== true) throw new Error(`XML error at line ${valid.err.line}, column ${valid.err.col}: ${valid.err.msg}`);
  const outside = xml
    .replace(/^<\?xml[^>]*\?>/, "")
    .replace(/<!--[\s\S]*?-->/g, "")
    .trim();
  if (!outside.startsWith("<") || !outside.endsWith(">")) throw new Error("XML error: text outside the root element");
  const nodes = new XMLParser(XML_OPTIONS).parse(xml) as XmlNode[];
  const elements = nodes.filter((n) => !("#comment" in n) && !("#text" in n && String(n["#text"]).trim() === ""));
  if (elements.length !== 1) throw new Error(`XML error: expected one root element, found ${elements.length}`);
  return toElement(elements[0]!, new Set(["xml"]));
}

function toElement(node: XmlNode, scope: ReadonlySet<string>): XmlElement {
  if ("#text" in node) throw new Error("XML error: text outside the root element");
  const name = Object.keys(node).find((k) => k !== ":@")!;
  const attrs = new Map(Object.entries((node[":@"] ?? {}) as Record<string, unknown>).map(([k, v]) => [k, String(v)]));
  const prefixes = new Set(scope);
  for (const k of attrs.keys()) if (k.startsWith("xmlns:")) prefixes.add(k.slice(6));
  for (const n of [name, ...attrs.keys()]) {
    const p = n.includes(":") ? n.slice(0, n.indexOf(":")) : undefined;
    if (p !== undefined && p !== "xmlns" && !prefixes.has(p)) throw new Error(`XML error: undeclared namespace prefix ${p} on <${name}>`);
  }
  const el: XmlElement = { name, attrs, children: [], text: "" };
  for (const c of node[name] as XmlNode[]) {
    if ("#comment" in c) continue;
    if ("#text" in c) el.text += String(c["#text"]);
    else el.children.push(toElement(c, prefixes));
  }
  return el;
}
