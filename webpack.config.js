// Builds dist/: taskpane.html (shared runtime: functions + panel bundles), preview.html
// (the panel over an in-memory workbook), worker.js, functions.json, icons, manifest.xml.
// ADDIN_URL (default https://localhost:3000/) is written into the manifest's URLs.
const path = require("path");
const HtmlWebpackPlugin = require("html-webpack-plugin");
const CopyWebpackPlugin = require("copy-webpack-plugin");
const CustomFunctionsMetadataPlugin = require("custom-functions-metadata-plugin");

const DEV_URL = "https://localhost:3000/";

function addinUrl() {
  let url = process.env.ADDIN_URL || DEV_URL;
  if (!/^https:\/\//.test(url)) throw new Error(`ADDIN_URL must start with https:// (got ${url})`);
  if (!url.endsWith("/")) url += "/";
  return url;
}

/** Points the manifest's URLs (and its AppDomain, an origin) at the hosting address. */
function rewriteManifest(xml, url) {
  return xml.split(DEV_URL).join(url).split(new URL(DEV_URL).origin).join(new URL(url).origin);
}

module.exports = (env, argv) => {
  const mode = argv.mode || "production";
  const url = addinUrl();
  return {
    mode,
    devtool: mode === "production" ? "source-map" : "eval-source-map",
    entry: {
      functions: "./functions/functions.ts",
      taskpane: "./taskpane/taskpane.ts",
      preview: "./taskpane/preview.ts",
      worker: "./functions/worker.ts",
      "analysis-worker": "./taskpane/analysis-worker.ts",
    },
    output: {
      path: path.resolve(__dirname, "dist"),
      filename: "[name].js",
      clean: true,
    },
    resolve: { extensions: [".ts", ".js"] },
    module: {
      rules: [{ test: /\.ts$/, exclude: /node_modules/, use: { loader: "ts-loader", options: { configFile: "tsconfig.build.json", onlyCompileBundledFiles: true } } }],
    },
    performance: { hints: false },
    plugins: [
      new CustomFunctionsMetadataPlugin({ output: "functions.json", input: "./functions/functions.ts" }),
      new HtmlWebpackPlugin({ filename: "taskpane.html", template: "./taskpane/taskpane.html", chunks: ["functions", "taskpane"], chunksSortMode: "manual" }),
      new HtmlWebpackPlugin({ filename: "preview.html", template: "./taskpane/preview.html", chunks: ["preview"] }),
      new CopyWebpackPlugin({
        patterns: [
          { from: "assets/*.png", to: "assets/[name][ext]" },
          { from: "manifest.xml", to: "manifest.xml", transform: (content) => rewriteManifest(content.toString(), url) },
        ],
      }),
    ],
  };
};
