/**
 * Request size of writes through the Office.js adapter (office-addin-mock fake host). Excel on
 * the web caps one request at 5 MB (Microsoft, "Resource limits and performance optimization");
 * the adapter budgets about 2 MB a request, counting text and formats.
 */
import { afterEach, describe, expect, it } from "vitest";
import { PAYLOAD_BUDGET_BYTES } from "../../src/workbook/excel/planGridWrite.js";
import { host, install, uninstall } from "./officeMockHost.js";

afterEach(uninstall);

describe("payload budget", () => {
  it("a 2 000-row write with long text is split so that no sync carries more than the budget", async () => {
    const note = "Deliver to the back door; ring twice. ".repeat(20); // 760 characters
    const values = Array.from({ length: 2000 }, (_, r) => [`S${r + 1}`, `Ståle's bakery ${r}`, note, note, r * 1.5, "=not a formula"]);
    const book = install({});
    await book.addSheet("Big plan", { values: [["Stop", "Name", "Note", "Note 2", "Km", "Text"], ...values] });
    const perSync: number[] = [0];
    for (const entry of host().log) {
      if (entry[0] === "sync") perSync.push(0);
      else if (entry[0] === "values" || entry[0] === "numberFormat")
        perSync[perSync.length - 1]! += new TextEncoder().encode(JSON.stringify(entry[3])).length;
    }
    const total = perSync.reduce((a, b) => a + b, 0);
    expect(total).toBeGreaterThan(PAYLOAD_BUDGET_BYTES); // the test really needs splitting
    expect(perSync.filter((b) => b > 0).length).toBeGreaterThanOrEqual(2);
    expect(Math.max(...perSync)).toBeLessThanOrEqual(PAYLOAD_BUDGET_BYTES);
    const written = host()
      .log.filter((e) => e[0] === "values")
      .flatMap((e) => e[3] as unknown[][]);
    expect(written).toHaveLength(2001);
    expect(written[2000]![2]).toBe(note);
  });
});
