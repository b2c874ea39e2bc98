import { mkdtemp, writeFile } from "node:fs/promises";
import { request } from "node:http";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { serveStatic } from "../../scripts/serveStatic.js";

/** A raw GET (the path is sent as is, so a malformed escape reaches the server). */
function get(url: string, path: string): Promise<number> {
  return new Promise((ok, fail) => {
    const req = request(url + path, { method: "GET" }, (res) => {
      res.resume();
      ok(res.statusCode ?? 0);
    });
    req.on("error", fail);
    req.end();
  });
}

describe("serveStatic (127.0.0.1 only)", () => {
  it("answers 400 to a malformed percent-escape (RFC 3986 §2.1) and keeps serving", async () => {
    const dir = await mkdtemp(join(tmpdir(), "kiln-static-"));
    await writeFile(join(dir, "index.html"), "<!doctype html><title>t</title>");
    const { server, url } = await serveStatic(dir);
    try {
      expect(await get(url, "/%E0%A4%A")).toBe(400);
      expect(await get(url, "/%")).toBe(400);
      expect(await get(url, "/")).toBe(200);
      expect(await get(url, "/missing.js")).toBe(404);
    } finally {
      server.close();
    }
  });
});
