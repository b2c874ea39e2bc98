// Builds the task pane (taskpane.html + its script, the solver worker and icons) into dist/.
// `npm run build` = production build for https://localhost:3000; `npm run build -- --env base=https://host/path`
// writes dist/manifest.xml for that deployment. `npm start` = HTTPS dev server on https://localhost:3000.
// File names carry a content hash (Office hosts cache hard); the production build has no source maps;
// office.js comes from Microsoft's CDN in the Office host and is not copied (the standalone page loads none).
import { createHash } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import HtmlWebpackPlugin from "html-webpack-plugin";
import CopyWebpackPlugin from "copy-webpack-plugin";
import { DEV_BASE, OFFICE_JS_CDN, contentSecurityPolicy, manifestForBase, parseBase } from "./scripts/addinBuild.js";

const root = path.dirname(fileURLToPath(import.meta.url));
const certDir = path.join(os.homedir(), ".office-addin-dev-certs");

/** "taskpane.css" -> "taskpane.1a2b3c4d.css": the name a copied file gets, from its content. */
function hashedName(file) {
  const hash = createHash("sha256")
    .update(fs.readFileSync(path.join(root, file)))
    .digest("hex")
    .slice(0, 8);
  const ext = path.extname(file);
  return `${path.basename(file, ext)}.${hash}${ext}`;
}

/** The HTTPS options of the dev server: office-addin-dev-certs files when present, else a self-signed cert. */
function httpsOptions() {
  const files = { key: "localhost.key", cert: "localhost.crt", ca: "ca.crt" };
  const present = Object.values(files).every((f) => fs.existsSync(path.join(certDir, f)));
  if (!present) {
    console.warn(
      "[kiln] No Office dev certificates in ~/.office-addin-dev-certs; using webpack-dev-server's self-signed certificate.\n" +
        "[kiln] Excel rejects an untrusted certificate. Create and trust one with: npx office-addin-dev-certs install",
    );
    return { type: "https" };
  }
  return {
    type: "https",
    options: Object.fromEntries(Object.entries(files).map(([k, f]) => [k, fs.readFileSync(path.join(certDir, f))])),
  };
}

const SIDELOAD_STEPS = `
[kiln] Task pane: ${DEV_BASE}/taskpane.html  (also works as a standalone page outside Excel)
[kiln] Sideload in Excel on the web: Home > Add-ins > Upload my add-in > choose manifest.xml from the project root.
[kiln] Sideload in Excel desktop (Windows): share a folder holding manifest.xml, add its \\\\host\\share path under
[kiln]   File > Options > Trust Center > Trust Center Settings > Trusted Add-in Catalogs (tick "Show in Menu"),
[kiln]   restart Excel, then Home > Add-ins > More Add-ins > Shared Folder.
`;

export default (env = {}, argv = {}) => {
  const production = argv.mode === "production";
  const serving = Boolean(env.WEBPACK_SERVE);
  const base = parseBase(typeof env.base === "string" ? env.base : DEV_BASE);
  const css = { taskpane: hashedName("src/taskpane/taskpane.css"), uplot: hashedName("node_modules/uplot/dist/uPlot.min.css") };
  const scripts = {
    officeLoader: hashedName("src/taskpane/officeLoader.js"),
    commandsLoader: hashedName("src/taskpane/commandsLoader.js"),
  };
  // Each page carries its Content-Security-Policy in a meta tag fixed at build time (no inline script anywhere).
  const addinCsp = contentSecurityPolicy({ officeHost: true });
  return {
    mode: production ? "production" : "development",
    // No eval-based source maps in development either: the pages' policy forbids eval.
    devtool: production ? false : "source-map",
    context: root,
    entry: { taskpane: "./src/taskpane/taskpane.ts" },
    output: {
      path: path.join(root, "dist"),
      filename: "[name].[contenthash:8].js",
      chunkFilename: "[name].[contenthash:8].js",
      // dist/cli/ is the compiled command line (npm run build:cli), not this build's to remove.
      clean: { keep: /^cli[\\/]/ },
    },
    resolve: {
      extensions: [".ts", ".js"],
      // Sources import "./x.js" (ES module style); resolve those to the .ts files.
      extensionAlias: { ".js": [".ts", ".js"] },
      // exceljs' browser build bundles its own polyfills, so no Node built-in is pulled in.
      alias: { exceljs$: path.join(root, "node_modules", "exceljs", "dist", "exceljs.min.js") },
      fallback: { fs: false, path: false, os: false, crypto: false, stream: false, buffer: false, util: false, zlib: false },
    },
    module: {
      rules: [
        {
          test: /\.ts$/,
          exclude: /node_modules/,
          use: { loader: "ts-loader", options: { transpileOnly: true, compilerOptions: { noEmit: false, sourceMap: !production } } },
        },
        { test: /\.css$/, type: "asset/source" },
      ],
      // exceljs.min.js is a prebuilt UMD bundle: nothing to parse for requires.
      noParse: /exceljs[\\/]dist[\\/]exceljs\.min\.js$/,
    },
    performance: { hints: false },
    optimization: {
      // exceljs (about 1 MB, already minified) in a chunk of its own, loaded with the standalone pane.
      splitChunks: { cacheGroups: { exceljs: { test: /[\\/]exceljs[\\/]/, name: "exceljs", chunks: "async", enforce: true } } },
    },
    plugins: [
      // The add-in's page: loads office.js from Microsoft's CDN when an Office host may be around.
      new HtmlWebpackPlugin({
        template: "./src/taskpane/taskpane.html",
        filename: "taskpane.html",
        chunks: ["taskpane"],
        scriptLoading: "defer",
        officeJs: OFFICE_JS_CDN,
        officeLoader: scripts.officeLoader,
        csp: addinCsp,
        css,
      }),
      // The standalone page: the same pane without any Office code, scripts from its own origin only.
      new HtmlWebpackPlugin({
        template: "./src/taskpane/taskpane.html",
        filename: "index.html",
        chunks: ["taskpane"],
        scriptLoading: "defer",
        officeLoader: null,
        csp: contentSecurityPolicy({ officeHost: false }),
        css,
      }),
      // The manifest's FunctionFile and SupportUrl pages: static, no bundle.
      new HtmlWebpackPlugin({
        template: "./src/taskpane/commands.html",
        filename: "commands.html",
        chunks: [],
        inject: false,
        officeJs: OFFICE_JS_CDN,
        commandsLoader: scripts.commandsLoader,
        csp: addinCsp,
      }),
      new HtmlWebpackPlugin({
        template: "./src/taskpane/help.html",
        filename: "help.html",
        chunks: [],
        inject: false,
        csp: contentSecurityPolicy({ officeHost: false }),
        css,
      }),
      new CopyWebpackPlugin({
        patterns: [
          { from: "src/taskpane/taskpane.css", to: css.taskpane },
          { from: "src/taskpane/officeLoader.js", to: scripts.officeLoader },
          { from: "src/taskpane/commandsLoader.js", to: scripts.commandsLoader },
          { from: "node_modules/uplot/dist/uPlot.min.css", to: css.uplot, info: { minimized: true } },
          { from: "assets", to: "assets", noErrorOnMissing: true },
          { from: "manifest.xml", to: "manifest.xml", transform: (content) => manifestForBase(content.toString(), base) },
        ],
      }),
    ],
    devServer: serving
      ? {
          port: 3000,
          host: "localhost",
          server: httpsOptions(),
          headers: { "Access-Control-Allow-Origin": "*" },
          static: false,
          hot: false,
          open: false,
          onListening: () => console.log(SIDELOAD_STEPS),
        }
      : undefined,
  };
};
