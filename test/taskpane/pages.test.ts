import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { CAUTION_TEXT } from "../../src/sheets/caution.js";
import { PANE_FORM_FIELDS } from "../../src/taskpane/settingsFromForm.js";

const read = (name: string) => readFileSync(new URL(`../../src/taskpane/${name}`, import.meta.url), "utf8");
const squash = (s: string) => s.replace(/\s+/g, " ");

describe("pane pages", () => {
  it("the help page carries the caution text word for word", () => {
    expect(squash(read("help.html"))).toContain(CAUTION_TEXT);
  });

  it("taskpane.html has an input for every settings field the pane reads", () => {
    const html = read("taskpane.html");
    for (const id of PANE_FORM_FIELDS) expect(html).toMatch(new RegExp(`id="${id}"`));
  });

  it("taskpane.html loads office.js only behind the Office-host check (standalone page stays offline)", () => {
    const html = read("taskpane.html");
    expect(html).not.toMatch(/<script src="office\/office\.js"><\/script>/);
    // The check is in the loader file (the page's policy allows no inline script).
    expect(html).toMatch(/officeLoader/);
    expect(read("officeLoader.js")).toMatch(/_host_Info/);
  });

  it("the help page names the published source of the route palette", () => {
    expect(squash(read("help.html"))).toMatch(/Okabe and Ito, <em>Color Universal Design<\/em> \(2008\)/);
    expect(read("vehicleColour.ts")).toMatch(/Okabe & Ito \(2008\)/);
  });
});
