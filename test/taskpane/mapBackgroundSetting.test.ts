/**
 * The background map fields: a tile URL template in the common {z}/{x}/{y} tile addressing
 * (common practice of web tile servers) with an attribution, or nothing at all.
 */
import { describe, expect, it } from "vitest";
import { MAP_BACKGROUND_KEY, parseMapBackground, readMapBackground } from "../../src/taskpane/mapBackgroundSetting.js";

describe("parseMapBackground", () => {
  it("reads a blank template as no background, whatever the attribution", () => {
    expect(parseMapBackground("  ", "anything")).toEqual({ background: undefined });
  });

  it("accepts an https template with {z}, {x}, {y} and {s}, trimmed", () => {
    expect(parseMapBackground(" https://{s}.tiles.example/{z}/{x}/{y}{r}.png ", " © Example ")).toEqual({
      background: { template: "https://{s}.tiles.example/{z}/{x}/{y}{r}.png", attribution: "© Example" },
    });
  });

  it.each([
    ["https://tiles.example/{z}/{x}.png", "© E", /\{y\} missing/],
    ["https://tiles.example/{z}/{x}/{y}.png?key={apikey}", "© E", /\{apikey\} is not a placeholder/],
    ["tiles.example/{z}/{x}/{y}.png", "© E", /not a web address/],
    ["ftp://tiles.example/{z}/{x}/{y}.png", "© E", /ftp: addresses/],
    ["https://tiles.example/{z}/{x}/{y}.png", "", /Attribution: empty/],
    ["https://tiles.example/{z}/{x}/{y}.png", "x".repeat(301), /shorten it to at most 300/],
  ])("refuses %s with a message naming the field and the fix", (template, attribution, pattern) => {
    const out = parseMapBackground(template, attribution);
    expect("message" in out && out.message).toMatch(pattern);
    expect("message" in out && out.message).toMatch(/^Background map, /);
  });
});

describe("readMapBackground", () => {
  it("round-trips what the pane stores and ignores a broken entry", () => {
    const stored = JSON.stringify({ template: "http://127.0.0.1:9/{z}/{x}/{y}.png", attribution: "Test tiles" });
    expect(readMapBackground(stored)).toEqual({ template: "http://127.0.0.1:9/{z}/{x}/{y}.png", attribution: "Test tiles" });
    expect(readMapBackground("{not json")).toBeUndefined();
    expect(readMapBackground(JSON.stringify({ template: "https://x.example/{z}.png", attribution: "a" }))).toBeUndefined();
    expect(readMapBackground(undefined)).toBeUndefined();
    expect(MAP_BACKGROUND_KEY).toMatch(/^kiln\./);
  });
});
