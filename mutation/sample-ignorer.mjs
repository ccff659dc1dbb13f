/**
 * A Stryker ignore plugin for the sample parts (scripts/mutation-sample.mjs): while the sample of
 * MUTATE_SAMPLE (mutation/sample/<folder>.json) is run, every syntax node that holds no drawn span
 * is ignored with its subtree, so a drawn span that is a block (a removed block, an emptied object)
 * runs without the hundreds of mutants nested in it. Nodes between two nested drawn spans still
 * run; only the drawn spans' mutants count toward the estimate.
 */
import fs from "fs";
import path from "path";
import { declareValuePlugin, PluginKind } from "@stryker-mutator/api/plugin";

let byFile;
function drawn() {
  if (byFile) return byFile;
  byFile = new Map();
  const file = process.env.MUTATE_SAMPLE;
  if (!file) return byFile;
  for (const m of JSON.parse(fs.readFileSync(file, "utf8")).drawnSpans) {
    const key = path.resolve(m.file);
    if (!byFile.has(key)) byFile.set(key, []);
    // the sample's lines and columns are 1-based; babel's lines are 1-based and columns 0-based
    byFile.get(key).push({ sl: m.start.line, sc: m.start.column - 1, el: m.end.line, ec: m.end.column - 1 });
  }
  return byFile;
}

const before = (l1, c1, l2, c2) => l1 < l2 || (l1 === l2 && c1 <= c2);

/** Whether the node's span holds a drawn span (babel locations: 1-based lines, 0-based columns). */
export function holdsDrawn(fileName, loc) {
  const list = drawn().get(path.resolve(fileName));
  if (!list || !loc) return false;
  return list.some((m) => before(loc.start.line, loc.start.column, m.sl, m.sc) && before(m.el, m.ec, loc.end.line, loc.end.column));
}

export const sampleIgnorer = {
  shouldIgnore(nodePath) {
    const fileName = nodePath.hub?.file?.opts?.filename;
    if (!fileName) return undefined;
    return holdsDrawn(fileName, nodePath.node.loc) ? undefined : "not in the drawn sample (mutation/sample)";
  },
};

export const strykerPlugins = [declareValuePlugin(PluginKind.Ignore, "drawn-sample", sampleIgnorer)];
