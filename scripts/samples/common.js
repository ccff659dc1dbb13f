/**
 * Shared pieces of the sample-workbook generator: a seeded random source, the invented scenario's
 * names, the colour scheme and a few ExcelJS helpers. Everything here is invented for the demo.
 */
"use strict";

/** mulberry32: a small seeded generator, so `npm run samples` always writes the same data. */
function rng(seed) {
  let a = seed >>> 0;
  const next = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const normal = (mean, sd) => {
    const u = Math.max(next(), 1e-12);
    const v = next();
    return mean + sd * Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
  };
  return {
    next,
    normal,
    uniform: (lo, hi) => lo + (hi - lo) * next(),
    lognormal: (median, sdLog) => median * Math.exp(normal(0, sdLog)),
    pick: (list) => list[Math.floor(next() * list.length)],
    chance: (p) => next() < p,
  };
}

const round = (x, digits) => {
  const f = 10 ** digits;
  return Math.round(x * f) / f;
};
const clamp = (x, lo, hi) => Math.min(hi, Math.max(lo, x));

/** The invented scenario. No name here belongs to a real firm, farm, lab or product. */
const SCENARIO = {
  consultancy: "Marrowbrook Agronomy",
  district: "Caddow Valley",
  season: "2025",
  labA: {
    name: "Brindlewick Soil Laboratory",
    sheet: "Lab A Brindlewick",
    report: "BSL-25-0418",
  },
  labB: {
    name: "Quillon Downs Analytical",
    sheet: "Lab B Quillon Downs",
    report: "QDA/2025/1187",
  },
  farmsA: [
    { name: "Wrenhollow", code: "WRN", samples: 40, pMethod: "Mehlich-3", product: "Greyspar Aglime", rotation: "corn-soybean" },
    { name: "Pellowmere", code: "PLM", samples: 36, pMethod: "Bray-1", product: "Fenlow Fine Lime", rotation: "corn-soybean" },
    { name: "Quondle Hill", code: "QDH", samples: 38, pMethod: "Mehlich-3", product: "Slatebrook Dolomite", rotation: "corn-soybean-wheat" },
    { name: "Brackenstow", code: "BRK", samples: 36, pMethod: "Bray-1", product: "Greyspar Aglime", rotation: "corn-soybean" },
  ],
  farmsB: [
    { name: "Ambergully", code: "AMB", samples: 44, bulkDensity: 1.32, product: "Greyspar Aglime" },
    { name: "Tarnaby Flats", code: "TNF", samples: 42, bulkDensity: 1.41, product: "Fenlow Fine Lime" },
    { name: "Mistlecombe", code: "MSC", samples: 44, bulkDensity: 1.27, product: "Slatebrook Dolomite" },
  ],
  /** Invented liming products: CCE, moisture and sieve fractions (finest first). */
  products: [
    { name: "Greyspar Aglime", kind: "crushed limestone", cce: 92, moisture: 5, fractions: [52, 30, 14, 4] },
    { name: "Fenlow Fine Lime", kind: "fine-ground limestone", cce: 97, moisture: 2, fractions: [88, 10, 2, 0] },
    { name: "Slatebrook Dolomite", kind: "dolomitic limestone", cce: 104, moisture: 3, fractions: [60, 28, 10, 2] },
  ],
};

const PADDOCK_WORDS = [
  "Creek", "Top Flat", "Windmill", "Back", "Ridge", "Dam", "Road", "Shed", "Hill", "Gully",
  "Swamp", "Bottom", "Corner", "Long", "Stony", "Red Gate", "Cottage", "Boundary", "Spring", "Lane",
];

/** Okabe–Ito colours (colour-blind safe) and light tints of them, as ARGB. */
const COLOURS = {
  black: "FF000000",
  orange: "FFE69F00",
  sky: "FF56B4E9",
  green: "FF009E73",
  yellow: "FFF0E442",
  blue: "FF0072B2",
  vermillion: "FFD55E00",
  purple: "FFCC79A7",
  white: "FFFFFFFF",
  grey: "FF595959",
  tintOrange: "FFFBEBC8",
  tintSky: "FFDDEFFA",
  tintGreen: "FFCCEDE3",
  tintYellow: "FFFBF8CF",
  tintBlue: "FFD6E6F2",
  tintVermillion: "FFF7D9C4",
  tintPurple: "FFF4E1EB",
  rule: "FFBFBFBF",
};

const fill = (argb) => ({ type: "pattern", pattern: "solid", fgColor: { argb } });
const thin = (argb = COLOURS.rule) => ({ style: "thin", color: { argb } });

/** Column number (1-based) → letters, with the engine's own A1 code (build/ is made by npm run samples). */
const { columnLetters } = require("../../build/src/engine/cellref");
function col(n) {
  return columnLetters(n - 1);
}

/** A sheet name quoted for a formula reference. */
const sheetRef = (name) => (/^[A-Za-z_][A-Za-z0-9_]*$/.test(name) ? name : `'${name.replace(/'/g, "''")}'`);

/** Puts a typed formula (no leading "=") in a cell. */
function formula(cell, text) {
  cell.value = { formula: text };
}

/**
 * Writes a block of "Read me" lines: [text, style] pairs; style "h" heading, "n" normal, "c"
 * caution, "f" a live formula (the text is the formula). Returns the row of each line.
 */
function readMe(ws, title, lines) {
  ws.getColumn(1).width = 2;
  ws.getColumn(2).width = 120;
  const t = ws.getCell("B2");
  t.value = title;
  t.font = { bold: true, size: 16, color: { argb: COLOURS.white } };
  t.fill = fill(COLOURS.blue);
  ws.getRow(2).height = 26;
  let r = 4;
  const rows = [];
  for (const [text, style] of lines) {
    rows.push(r);
    const c = ws.getCell(`B${r}`);
    if (style === "f") {
      formula(c, text);
      c.font = { italic: true };
      c.alignment = { horizontal: "left" };
      r += 1;
      continue;
    }
    c.value = text;
    c.alignment = { wrapText: true, vertical: "top" };
    if (style === "h") {
      c.font = { bold: true, size: 12, color: { argb: COLOURS.blue } };
      c.border = { bottom: thin(COLOURS.blue) };
    } else if (style === "c") {
      c.fill = fill(COLOURS.tintVermillion);
      c.font = { bold: true };
    }
    const chars = String(text).length;
    if (chars > 115) ws.getRow(r).height = 15 * Math.ceil(chars / 115);
    r += style === "h" ? 1 : 1;
  }
  return rows;
}

/** Fixes the package dates so regenerated files differ only where the content does. */
function fixDates(wb) {
  const when = new Date(Date.UTC(2025, 5, 30, 9, 0, 0));
  wb.creator = SCENARIO.consultancy;
  wb.lastModifiedBy = SCENARIO.consultancy;
  wb.created = when;
  wb.modified = when;
}

module.exports = { rng, round, clamp, SCENARIO, PADDOCK_WORDS, COLOURS, fill, thin, col, sheetRef, formula, readMe, fixDates };
