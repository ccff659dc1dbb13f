/**
 * Builds the add-in into dist/: functions.js (the bindings and the science), functions.html (the
 * page Excel's custom-functions runtime loads), functions.json (metadata generated from the JSDoc
 * by scripts/metadata.js), manifest.xml, icons and help.
 *
 * Options (webpack --env):
 *   deploy=https://host/path  write manifest URLs for that host instead of https://localhost:3000
 *   cdn                       reference Office's hosted custom-functions runtime instead of the
 *                             copy shipped in dist/ (store submissions expect the hosted script)
 * The environment variable SOILCELL_HOST does the same as deploy=.
 */
const path = require("path");
const fs = require("fs");
const HtmlWebpackPlugin = require("html-webpack-plugin");
const CopyWebpackPlugin = require("copy-webpack-plugin");

const DEV_HOST = "https://localhost:3000";
const CDN_RUNTIME = "https://appsforoffice.microsoft.com/lib/1/hosted/custom-functions-runtime.js";

module.exports = (env = {}) => {
  const host = (env.deploy && env.deploy !== true ? env.deploy : process.env.SOILCELL_HOST || DEV_HOST).replace(/\/$/, "");
  const cdn = Boolean(env.cdn);
  const metadata = path.join(__dirname, "generated", "functions.json");
  if (!fs.existsSync(metadata)) throw new Error("generated/functions.json is missing: run `npm run metadata` first");
  return {
    mode: "production",
    devtool: "source-map",
    entry: { functions: "./src/addin/register.ts" },
    output: { path: path.join(__dirname, "dist"), filename: "[name].js", clean: true },
    resolve: { extensions: [".ts", ".js", ".json"] },
    module: {
      rules: [{ test: /\.ts$/, exclude: /node_modules/, use: { loader: "ts-loader", options: { configFile: "tsconfig.build.json", transpileOnly: false } } }],
    },
    performance: { hints: false },
    plugins: [
      new HtmlWebpackPlugin({
        filename: "functions.html",
        template: "./src/addin/functions.html",
        chunks: ["functions"],
        runtimeSrc: cdn ? CDN_RUNTIME : "custom-functions-runtime.js",
        runtimeOrigin: cdn ? "https://appsforoffice.microsoft.com" : "",
      }),
      new CopyWebpackPlugin({
        patterns: [
          { from: metadata, to: "functions.json" },
          { from: "assets/*.png", to: "assets/[name][ext]" },
          { from: "src/addin/help.html", to: "help.html" },
          { from: "manifest.xml", to: "manifest.xml", transform: (content) => content.toString().split(DEV_HOST).join(host) },
          ...(cdn ? [] : [{ from: require.resolve("@microsoft/office-js/dist/custom-functions-runtime.js"), to: "custom-functions-runtime.js" }]),
        ],
      }),
    ],
    devServer: {
      static: { directory: path.join(__dirname, "dist") },
      port: 3000,
      server: "https",
      headers: { "Access-Control-Allow-Origin": "*" },
    },
  };
};
