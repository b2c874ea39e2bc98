// Builds the task pane (taskpane.html + its script, the solver worker, office.js and icons) into dist/.
// `npm run build` = production build; `npm start` = HTTPS dev server on https://localhost:3000.
const path = require("node:path");
const fs = require("node:fs");
const os = require("node:os");
const HtmlWebpackPlugin = require("html-webpack-plugin");
const CopyWebpackPlugin = require("copy-webpack-plugin");

const root = __dirname;
const officeDist = path.join(root, "node_modules", "@microsoft", "office-js", "dist");
const certDir = path.join(os.homedir(), ".office-addin-dev-certs");

/** office.js loads its host scripts and strings next to itself: copy only what Excel and the standalone page use. */
const officeFiles = [
  "office.js",
  "o15apptofilemappingtable.js",
  "es6-promise.js",
  "excel-*.js",
  "excelwebapp-*.js",
  "en-us/*.js",
  "telemetry/**",
  "ariatelemetry/**",
].map((pattern) => ({
  from: pattern,
  context: officeDist,
  to: "office/",
  noErrorOnMissing: true,
  globOptions: { ignore: ["**/*.debug.js"] },
  // Already minified by Microsoft: tell the minimizer to leave them alone (saves minutes per build).
  info: { minimized: true },
}));

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
[kiln] Task pane: https://localhost:3000/taskpane.html  (also works as a standalone page outside Excel)
[kiln] Sideload in Excel on the web: Home > Add-ins > Upload my add-in > choose manifest.xml from the project root.
[kiln] Sideload in Excel desktop (Windows): share a folder holding manifest.xml, add its \\\\host\\share path under
[kiln]   File > Options > Trust Center > Trust Center Settings > Trusted Add-in Catalogs (tick "Show in Menu"),
[kiln]   restart Excel, then Home > Add-ins > More Add-ins > Shared Folder.
`;

module.exports = (env, argv) => {
  const production = argv.mode === "production";
  const serving = Boolean(env && env.WEBPACK_SERVE);
  return {
    mode: production ? "production" : "development",
    devtool: production ? "source-map" : "eval-source-map",
    context: root,
    entry: { taskpane: "./src/taskpane/taskpane.ts" },
    output: {
      path: path.join(root, "dist"),
      filename: "[name].js",
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
          use: { loader: "ts-loader", options: { transpileOnly: true, compilerOptions: { noEmit: false, sourceMap: true } } },
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
      new HtmlWebpackPlugin({
        template: "./src/taskpane/taskpane.html",
        filename: "taskpane.html",
        chunks: ["taskpane"],
        scriptLoading: "defer",
      }),
      // The manifest's FunctionFile and SupportUrl pages: static, no bundle.
      new HtmlWebpackPlugin({ template: "./src/taskpane/commands.html", filename: "commands.html", chunks: [], inject: false }),
      new HtmlWebpackPlugin({ template: "./src/taskpane/help.html", filename: "help.html", chunks: [], inject: false }),
      new CopyWebpackPlugin({
        patterns: [
          ...officeFiles,
          { from: "src/taskpane/taskpane.css", to: "taskpane.css" },
          { from: "node_modules/uplot/dist/uPlot.min.css", to: "uPlot.min.css" },
          { from: "assets", to: "assets", noErrorOnMissing: true },
          { from: "manifest.xml", to: "manifest.xml", noErrorOnMissing: true },
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
