/**
 * A tiny static HTTP server for the built pane (dist/): the standalone page without Office,
 * and the server the browser test starts on a random port. Serves files only under `root`.
 *
 * Run: `npx tsx scripts/serveStatic.ts [port]` after `npm run build`, then open
 * http://127.0.0.1:<port>/ (the standalone page, index.html; taskpane.html is the add-in's page).
 */
import { createReadStream, statSync } from "node:fs";
import { createServer, type Server } from "node:http";
import { extname, join, normalize, resolve, sep } from "node:path";
import { fileURLToPath } from "node:url";

const TYPES: Record<string, string> = {
  ".html": "text/html; charset=utf-8",
  ".js": "text/javascript; charset=utf-8",
  ".css": "text/css; charset=utf-8",
  ".json": "application/json",
  ".map": "application/json",
  ".png": "image/png",
  ".svg": "image/svg+xml",
  ".xml": "application/xml",
  ".xlsx": "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet",
};

/**
 * Serve `root` on 127.0.0.1.
 *
 * @param root - the folder to serve
 * @param port - TCP port; 0 picks a free one (default)
 * @returns the server and its base URL
 * @example const { url, server } = await serveStatic("dist"); // url = "http://127.0.0.1:41234"
 */
export async function serveStatic(root: string, port = 0): Promise<{ server: Server; url: string }> {
  const base = resolve(root);
  const server = createServer((req, res) => {
    let path: string;
    try {
      path = decodeURIComponent(new URL(req.url ?? "/", "http://x").pathname);
    } catch {
      // A malformed escape ("%E0%A4%A") must not take the server down (RFC 3986 §2.1).
      res.writeHead(400, { "content-type": "text/plain" }).end("bad request: malformed percent-encoding in the URL");
      return;
    }
    const file = normalize(join(base, path === "/" ? "index.html" : path));
    if (file !== base && !file.startsWith(base + sep)) {
      res.writeHead(403).end("forbidden");
      return;
    }
    let size: number;
    try {
      const st = statSync(file);
      if (!st.isFile()) throw new Error("not a file");
      size = st.size;
    } catch {
      res.writeHead(404, { "content-type": "text/plain" }).end(`not found: ${path}`);
      return;
    }
    res.writeHead(200, {
      "content-type": TYPES[extname(file).toLowerCase()] ?? "application/octet-stream",
      "content-length": size,
      "cache-control": "no-store",
    });
    createReadStream(file).pipe(res);
  });
  await new Promise<void>((ok, fail) => {
    server.once("error", fail);
    server.listen(port, "127.0.0.1", () => ok());
  });
  const address = server.address();
  const actual = typeof address === "object" && address ? address.port : port;
  return { server, url: `http://127.0.0.1:${actual}` };
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const port = Number(process.argv[2] ?? 8080);
  const root = resolve(fileURLToPath(new URL("..", import.meta.url)), "dist");
  serveStatic(root, port).then(({ url }) => console.log(`Serving ${root} at ${url}/ (Ctrl+C stops)`));
}
