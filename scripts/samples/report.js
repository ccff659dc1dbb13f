/**
 * The season workbook's client report, built on soilcell's report convention: a report sheet
 * whose key cell (named Report_Key) selects a paddock by Sample ID, the list of keys (Report_Keys,
 * on the "Report list" sheet), and the names the batch reads (Report_Found, Report_File,
 * Report_Group, Report_Figures). `soilcell report` makes one page per paddock from it.
 *
 * The graphic is a band scale per analyte: a strip of cells coloured by the reference table's
 * bands (lowest at left), with the result as a white cell holding a black marker; and one strip
 * for the exchange complex, divided among the cations in proportion to their shares. Both are
 * conditional formats over cell values, which LibreOffice renders in PDF. Colours are the
 * Okabe–Ito set, ordered so neighbouring segments differ in lightness (readable in greyscale).
 * All data are invented (seeded); the layout is our own.
 */
"use strict";
const { SCENARIO, COLOURS, fill, thin, col, sheetRef, formula } = require("./common");

/** Columns of the page: labels, result, unit, band word, then the strip, then hidden helpers. */
const STRIP_CELLS = 30;
const STRIP_FIRST = 6; // F
const STRIP_LAST = STRIP_FIRST + STRIP_CELLS - 1; // AI
const MARGIN_RIGHT = STRIP_LAST + 1; // AJ
const H1 = STRIP_LAST + 3; // AL: first helper column (hidden)
const hc = (i) => col(H1 + i); // helper column letters: AL, AM, AN, …
const FIG_LABEL = hc(8); // AT
const FIG_VALUE = hc(9); // AU

/** Band colours, lowest band first (Okabe–Ito; relative luminance 0.22, 0.74, 0.41, 0.15, 0.29). */
const BAND_FILLS = [COLOURS.vermillion, COLOURS.yellow, COLOURS.sky, COLOURS.blue, COLOURS.purple];
const BAND_NAMES = ["vermillion", "yellow", "sky blue", "blue", "reddish purple"];
/** Exchange-complex colours: Ca, Mg, K, Na, Al + H (Lab B), not held by bases (Lab A, not measured). */
const CATION_FILLS = [COLOURS.blue, COLOURS.sky, COLOURS.yellow, COLOURS.orange, COLOURS.purple, "FFE5E5E5"];

const font = (o = {}) => ({ name: "Calibri", size: 10, ...o });

/**
 * The report sheet. `ctx` holds what the season builder knows: the lab sheets' columns (A, B,
 * refA, refB), the sample shown in the template, the product table, Settings and Bands refs.
 */
function buildReport(ws, wb, ctx) {
  const { refA, refB, reportSample, productTable, setRef, bands, about } = ctx;
  const widths = { A: 1.5, B: 26, C: 10, D: 12, E: 24 };
  for (const [c, w] of Object.entries(widths)) ws.getColumn(c).width = w;
  for (let c = STRIP_FIRST; c <= STRIP_LAST; c++) ws.getColumn(c).width = 1.2;
  ws.getColumn(MARGIN_RIGHT).width = 1.5;
  for (let i = -1; i < 12; i++) {
    ws.getColumn(H1 + i).width = 12;
    ws.getColumn(H1 + i).hidden = true;
  }
  const L = col(STRIP_LAST);
  const F0 = col(STRIP_FIRST);
  const heights = {};
  const height = (row, h) => (heights[row] = h);

  const merge = (row, from, to, value, style = {}) => {
    ws.mergeCells(`${from}${row}:${to}${row}`);
    const c = ws.getCell(`${from}${row}`);
    if (value !== undefined) {
      if (typeof value === "object" && value.formula) formula(c, value.formula);
      else c.value = value;
    }
    Object.assign(c, style);
    return c;
  };
  const section = (row, text, colour = COLOURS.blue, textColour = COLOURS.white) => {
    merge(row, "B", L, text, { font: font({ bold: true, size: 12, color: { argb: textColour } }), fill: fill(colour), alignment: { vertical: "middle", indent: 1 } });
    height(row, 18);
  };
  const label = (addr, text, o = {}) => {
    const c = ws.getCell(addr);
    c.value = text;
    c.font = font({ color: { argb: COLOURS.grey }, ...o });
    return c;
  };
  /** A note in small italics across the page, then a thin gap; returns the row after the gap. */
  const note = (row, text, h) => {
    merge(row, "B", L, text, { font: font({ italic: true, size: 8, color: { argb: COLOURS.grey } }), alignment: { wrapText: true, vertical: "top" } });
    height(row, h);
    height(row + 1, 6);
    return row + 2;
  };
  const rule = (row) => {
    for (let c = 2; c <= STRIP_LAST; c++) {
      const cell = ws.getCell(row, c);
      cell.border = { ...(cell.border ?? {}), bottom: thin() };
    }
  };

  // ---- Title and key ---------------------------------------------------------------------
  merge(1, "B", L, `${SCENARIO.consultancy} · Soil test report`, { font: font({ bold: true, size: 16, color: { argb: COLOURS.white } }), fill: fill(COLOURS.blue), alignment: { vertical: "middle", indent: 1 } });
  height(1, 26);
  merge(2, "B", L, `${SCENARIO.district}, ${SCENARIO.season} sampling · one page per paddock`, {
    font: font({ italic: true, color: { argb: COLOURS.blue } }),
    border: { bottom: { style: "medium", color: { argb: COLOURS.orange } } },
  });
  height(2, 16);
  height(3, 6);

  label("B4", "Sample ID", { color: { argb: COLOURS.black }, bold: true });
  const key = ws.getCell("C4");
  key.value = reportSample.id;
  key.font = font({ bold: true, size: 12 });
  key.fill = fill(COLOURS.tintYellow);
  key.border = { top: { style: "medium" }, bottom: { style: "medium" }, left: { style: "medium" }, right: { style: "medium" } };
  key.alignment = { horizontal: "center", vertical: "middle" };
  height(4, 20);

  // Helpers (hidden): the row of the sample in each lab sheet, and which lab.
  const H = (i, row) => `$${hc(i)}$${row}`;
  formula(ws.getCell(`${hc(0)}4`), `IFERROR(MATCH($C$4,${refA("id")},0),0)`);
  formula(ws.getCell(`${hc(1)}4`), `IFERROR(MATCH($C$4,${refB("id")},0),0)`);
  formula(ws.getCell(`${hc(2)}4`), `IF(${H(0, 4)}>0,"A",IF(${H(1, 4)}>0,"B",""))`);
  const rowA = H(0, 4);
  const rowB = H(1, 4);
  const lab = H(2, 4);
  /** A value from the paddock's lab sheet: Lab A column / Lab B column (null: not reported there). */
  const get = (keyA, keyB, missing = `"not reported"`) => {
    const a = keyA ? `INDEX(${refA(keyA)},${rowA})` : missing;
    const b = keyB ? `INDEX(${refB(keyB)},${rowB})` : missing;
    return `IF(${lab}="A",${a},IF(${lab}="B",${b},""))`;
  };
  const blankIfEmpty = (expr) => `IF(${expr}="","",${expr})`;

  merge(4, "E", L, { formula: `IF(${lab}="A","${SCENARIO.labA.name}",IF(${lab}="B","${SCENARIO.labB.name}","Sample ID not found in either lab sheet"))` }, { font: font({ bold: true }), alignment: { vertical: "middle" } });
  merge(5, "C", L, "Type a Sample ID from either lab sheet in the yellow cell (the cell is named Report_Key; soilcell report fills it for every paddock).", {
    font: font({ italic: true, size: 8, color: { argb: COLOURS.grey } }),
  });
  height(5, 12);

  const facts = [
    ["Farm", get("farm", "farm"), null],
    ["Paddock", get("paddock", "paddock"), null],
    ["Area (ha)", get("area", "area"), "0.0"],
    ["Next crop", get("crop", "crop"), null],
    ["Sampled", get("sampled", "sampled"), "d mmm yyyy"],
    ["Depth", `IF(${lab}="A","0-6 in (15 cm)",IF(${lab}="B","0-10 cm",""))`, null],
  ];
  const factCell = {};
  facts.forEach(([name, f, fmt], i) => {
    const row = 6 + Math.floor(i / 2);
    const left = i % 2 === 0;
    // Left: label in B, value across C:D (a farm's name is wider than C); right: label in E, value across the strip.
    label(`${left ? "B" : "E"}${row}`, name);
    const c = left ? merge(row, "C", "D") : merge(row, F0, L);
    formula(c, f);
    c.font = font({ bold: true });
    c.alignment = { horizontal: "left" };
    if (fmt) c.numFmt = fmt;
    factCell[name] = left ? `C${row}` : `${F0}${row}`;
    height(row, 16);
  });
  height(9, 8);

  // ---- Soil tests against their bands ------------------------------------------------------
  section(10, "Soil tests against their bands");
  ["Analysis", "Result", "Unit", "Band (the table's word)"].forEach((h, i) => {
    const c = ws.getCell(11, 2 + i);
    c.value = h;
    c.font = font({ bold: true, size: 9 });
    c.border = { bottom: thin(COLOURS.black) };
  });
  merge(11, F0, L, "Band scale: lowest band at left · ◆ the result", { font: font({ bold: true, size: 9 }), alignment: { horizontal: "center" }, border: { bottom: thin(COLOURS.black) } });
  height(11, 15);

  const pM3 = `INDEX(${refA("pM3")},${rowA})`;
  const rotation = `INDEX(${refA("rotation")},${rowA})`;
  const cropB = `INDEX(${refB("crop")},${rowB})`;
  const cecA = `INDEX(${refA("cec")},${rowA})`;
  const t = (id) => `"${id}"`;
  const results = [
    { name: "pH (water)", value: get("ph", "phW"), unit: `""`, fmt: "0.0" },
    { name: "pH (CaCl2)", value: get(null, "phCa"), unit: `""`, fmt: "0.0" },
    { name: `IF(${lab}="B","Organic carbon","Organic matter")`, nameIsFormula: true, value: get("om", "oc"), unit: `"%"`, fmt: "0.0" },
    {
      name: `IF(${lab}="A",IF(${pM3}<>"","Phosphorus (Mehlich-3)","Phosphorus (Bray-1)"),"Phosphorus (Colwell)")`,
      nameIsFormula: true,
      value: `IF(${lab}="A",IF(${pM3}<>"",${pM3},INDEX(${refA("pBray")},${rowA})),IF(${lab}="B",INDEX(${refB("colwellP")},${rowB}),""))`,
      unit: `IF(${lab}="A","ppm","mg/kg")`,
      band: get("pBand", "pBand"),
      pos: get("pPos", "pPos"),
      // The table the band position was read against (as the lab sheets choose it).
      table: `IF(${lab}="A",IF(${pM3}<>"",IF(OR(ISNUMBER(SEARCH("wheat",${rotation})),ISNUMBER(SEARCH("alfalfa",${rotation}))),${t("tristate2020-m3-p-wheat-alfalfa")},${t("tristate2020-m3-p-corn-soybean")}),${t("sare-bray1-p")}),IF(${lab}="B",IF(${cropB}="canola",${t("grdc2020-colwell-p-canola")},${t("grdc2020-colwell-p-wheat")}),""))`,
      fmt: "0",
    },
    {
      name: `IF(${lab}="A","Potassium (Mehlich-3)","Potassium (Colwell)")`,
      nameIsFormula: true,
      value: get("k", "colwellK"),
      unit: `IF(${lab}="A","ppm","mg/kg")`,
      band: get("kBand", null, `"no reference table"`),
      pos: get("kPos", null, `""`),
      table: `IF(${lab}="A",IF(${cecA}="","",IF(${cecA}<=5,${t("tristate2020-m3-k-cec-5-or-less")},${t("tristate2020-m3-k-cec-above-5")})),"")`,
      fmt: "0",
    },
    {
      name: `IF(${lab}="A","Sulfur (SO4-S)","Sulfur (KCl-40, 0-30 cm)")`,
      nameIsFormula: true,
      value: get("s", "s"),
      unit: `IF(${lab}="A","ppm","mg/kg")`,
      band: get(null, "sBand", `"no reference table"`),
      pos: get(null, "sPos", `""`),
      table: `IF(${lab}="B",IF(${cropB}="canola",${t("anderson2013-kcl40-s-canola")},${t("anderson2013-kcl40-s-wheat")}),"")`,
      fmt: "0.0",
    },
    { name: "Zinc (DTPA)", value: get(null, "zn"), unit: `"mg/kg"`, band: get(null, "znBand", `""`), pos: get(null, "znPos", `""`), table: `IF(${lab}="B",${t("havlin1999-dtpa-zn")},"")`, fmt: "0.00" },
    { name: "Copper (DTPA)", value: get(null, "cu"), unit: `"mg/kg"`, band: get(null, "cuBand", `""`), pos: get(null, "cuPos", `""`), table: `IF(${lab}="B",${t("havlin1999-dtpa-cu")},"")`, fmt: "0.00" },
    // One limit only: a band word, no scale to draw (SOIL.BANDPOS needs two limits).
    { name: "Manganese (DTPA)", value: get(null, "mn"), unit: `"mg/kg"`, band: get(null, "mnBand", `""`), table: `IF(${lab}="B",${t("havlin1999-dtpa-mn")},"")`, fmt: "0.0" },
    { name: "Nitrate-N", value: get("no3kg", "no3kg"), unit: `IF(${lab}="A","kg/ha","kg/ha, 0-10 cm")`, fmt: "0.0" },
  ];
  const stripRows = [];
  const tableCells = [];
  let row = 12;
  for (const line of results) {
    const n = ws.getCell(`B${row}`);
    if (line.nameIsFormula) formula(n, line.name);
    else n.value = line.name;
    n.font = font();
    const v = ws.getCell(`C${row}`);
    formula(v, blankIfEmpty(line.value));
    v.numFmt = line.fmt;
    v.alignment = { horizontal: "right" };
    v.font = font({ bold: true });
    const u = ws.getCell(`D${row}`);
    formula(u, line.unit);
    u.font = font({ size: 9, color: { argb: COLOURS.grey } });
    if (line.band) {
      // Band words run to 41 characters ("Critical range (90-95 % of maximum yield)"): two lines.
      const b = ws.getCell(`E${row}`);
      formula(b, blankIfEmpty(line.band));
      b.font = font({ size: 8 });
      b.alignment = { wrapText: true, vertical: "middle" };
    }
    for (const x of ["B", "C", "D"]) ws.getCell(`${x}${row}`).alignment = { ...(ws.getCell(`${x}${row}`).alignment ?? {}), vertical: "middle" };
    if (line.table) {
      formula(ws.getCell(`${hc(2)}${row}`), line.table);
      tableCells.push(`${hc(2)}${row}`);
    }
    if (line.pos) {
      // Helpers: the band position (SOIL.BANDPOS, from the lab sheet) and the table's number of limits.
      formula(ws.getCell(`${hc(0)}${row}`), `IF(ISNUMBER(${line.pos}),${line.pos},"")`);
      formula(ws.getCell(`${hc(1)}${row}`), `IF(${hc(2)}${row}="","",COUNT(INDEX(${bands.limits},MATCH(${hc(2)}${row},${bands.ids},0),0)))`);
      const P = `$${hc(0)}${row}`;
      const N = `$${hc(1)}${row}`;
      for (let c = STRIP_FIRST; c <= STRIP_LAST; c++) {
        const j = c - STRIP_FIRST;
        // The cell's centre on the band scale (drawn from -0.5 to n - 0.5) gives its band; the
        // result's cell shows the marker (an arrow when the result lies beyond the drawn scale).
        const centre = `(-0.5+${j + 0.5}/${STRIP_CELLS}*${N})`;
        const marker = `MIN(${STRIP_CELLS - 1},MAX(0,INT((${P}+0.5)/${N}*${STRIP_CELLS})))=${j}`;
        formula(ws.getCell(row, c), `IF(AND(ISNUMBER(${P}),ISNUMBER(${N})),IF(${marker},IF(${P}<-0.5,"◀",IF(${P}>=${N}-0.5,"▶","◆")),INT(${centre})+2),"")`);
        const cell = ws.getCell(row, c);
        cell.numFmt = ";;;@";
        cell.alignment = { horizontal: "center", vertical: "middle" };
        cell.font = font({ size: 9, bold: true });
      }
      stripRows.push(row);
    }
    rule(row);
    height(row, 21);
    row++;
  }
  if (stripRows.length) {
    const ref = `${F0}${stripRows[0]}:${L}${stripRows[stripRows.length - 1]}`;
    const top = `${F0}${stripRows[0]}`;
    ws.addConditionalFormatting({
      ref,
      rules: [
        { type: "expression", priority: 1, stopIfTrue: true, formulae: [`ISTEXT(${top})`], style: { fill: { type: "pattern", pattern: "solid", bgColor: { argb: COLOURS.white } }, font: { color: { argb: COLOURS.black }, bold: true } } },
        ...BAND_FILLS.map((argb, i) => ({ type: "cellIs", operator: "equal", priority: 2 + i, formulae: [String(i + 1)], style: { fill: { type: "pattern", pattern: "solid", bgColor: { argb } } } })),
      ],
    });
  }
  row = note(row, `Band scale: each strip is the reference table's bands, lowest at left (${BAND_NAMES.join(", ")} from the lowest up; the first and last band drawn half a band wide); ◆ marks the result, ◀ ▶ a result beyond the drawn scale. The band word is the table's own; no strip where the table has one limit or the analyte none.`, 22);

  // ---- Exchange complex --------------------------------------------------------------------
  section(row, "Cation balance: the exchange complex");
  row++;
  ["Cation exchange", "Result", "Unit", "Key"].forEach((h, i) => {
    const c = ws.getCell(row, 2 + i);
    c.value = h;
    c.font = font({ bold: true, size: 9 });
    c.border = { bottom: thin(COLOURS.black) };
  });
  merge(row, F0, L, "Share of the exchange capacity, 0 to 100 %", { font: font({ bold: true, size: 9 }), alignment: { horizontal: "center" }, border: { bottom: thin(COLOURS.black) } });
  height(row, 15);
  row++;
  const capacity = [
    [`IF(${lab}="A","CEC, sum of bases","ECEC (with Al)")`, get("cecSum", "ecec"), `"cmol(+)/kg"`, "0.0"],
    [`IF(${lab}="A","CEC reported by the lab","")`, get("cec", null, `""`), `IF(${lab}="A","meq/100 g","")`, "0.0"],
  ];
  /** A result row: name (a formula when `nameFormula`), value, unit; returns the row after it. */
  const valueRow = (row, name, value, unit, fmt, nameFormula = true) => {
    const n = ws.getCell(`B${row}`);
    if (nameFormula) formula(n, name);
    else n.value = name;
    n.font = font();
    formula(ws.getCell(`C${row}`), blankIfEmpty(value));
    ws.getCell(`C${row}`).numFmt = fmt;
    ws.getCell(`C${row}`).font = font({ bold: true });
    formula(ws.getCell(`D${row}`), unit);
    ws.getCell(`D${row}`).font = font({ size: 9, color: { argb: COLOURS.grey } });
    rule(row);
    height(row, 16);
    return row + 1;
  };
  for (const [name, value, unit, fmt] of capacity) row = valueRow(row, name, value, unit, fmt);
  const share = `IF(${lab}="A","% of lab CEC","% of ECEC")`;
  const parts = [
    ["Calcium", get("caPct", "caPct"), "Ca", "0"],
    ["Magnesium", get("mgPct", "mgPct"), "Mg", "0"],
    ["Potassium", get("kPct", "kPct"), "K", "0.0"],
    ["Sodium (ESP)", get("esp", "esp"), "Na", "0.0"],
    [
      `IF(${lab}="A","Not held by bases","Al + H (Al saturation)")`,
      `IF(${lab}="A",IF(ISNUMBER(${get("bs", null)}),IF(${get("bs", null)}>100,"bases exceed the lab's CEC",100-${get("bs", null)}),""),${get(null, "alSat")})`,
      null,
      "0.0",
    ],
  ];
  const firstPart = row;
  parts.forEach(([name, value, symbol, fmt], i) => {
    valueRow(row, name, value, share, fmt, i === parts.length - 1);
    const k = ws.getCell(`E${row}`);
    if (symbol) {
      k.value = symbol;
      k.fill = fill(CATION_FILLS[i]);
      k.font = font({ bold: true, size: 9, color: { argb: i === 0 ? COLOURS.white : COLOURS.black } });
    } else {
      // The last part's colour depends on the lab: a code the strip's own colours paint, with its word.
      formula(k, `IF(${lab}="A",6,IF(${lab}="B",5,""))`);
      k.numFmt = '[=5]"Al + H";[=6]"not measured";""';
      k.font = font({ bold: true, size: 9 });
    }
    k.alignment = { horizontal: "center" };
    row++;
  });
  const lastPart = row - 1;
  // Helpers on the first part's row: 0, then the running total of the shares; whether all are numbers.
  const cum = [];
  formula(ws.getCell(`${hc(0)}${firstPart}`), "0");
  for (let i = 0; i < parts.length; i++) {
    const cell = `${hc(i + 1)}${firstPart}`;
    formula(ws.getCell(cell), i === 0 ? `IF(ISNUMBER(C${firstPart}),C${firstPart},"")` : `IF(AND(ISNUMBER(${hc(i)}${firstPart}),ISNUMBER(C${firstPart + i})),${hc(i)}${firstPart}+C${firstPart + i},"")`);
    cum.push(cell);
  }
  const total = `$${hc(parts.length)}$${firstPart}`;
  const bounds = `$${hc(0)}$${firstPart}:$${hc(parts.length)}$${firstPart}`;
  for (let r = firstPart; r <= lastPart; r++) {
    for (let c = STRIP_FIRST; c <= STRIP_LAST; c++) {
      const j = c - STRIP_FIRST;
      const centre = ((j + 0.5) * 100) / STRIP_CELLS;
      // The cell's centre (in % of the capacity) falls in one cation's share: its code paints it.
      const at = `MATCH(${centre},${bounds},1)`;
      formula(ws.getCell(r, c), `IF(ISNUMBER(${total}),IF(${centre}>=${total},"",IF(${at}=${parts.length},IF(${lab}="A",6,5),${at})),"")`);
      const cell = ws.getCell(r, c);
      cell.numFmt = ";;;@";
    }
  }
  ws.addConditionalFormatting({
    ref: `${F0}${firstPart}:${L}${lastPart} E${lastPart}`,
    rules: CATION_FILLS.map((argb, i) => ({ type: "cellIs", operator: "equal", priority: 10 + i, formulae: [String(i + 1)], style: { fill: { type: "pattern", pattern: "solid", bgColor: { argb } } } })),
  });
  // Scale marks under the strip, and the Ca:Mg ratio.
  formula(ws.getCell(`B${row}`), `"Ca:Mg ratio"`);
  ws.getCell(`B${row}`).font = font();
  formula(ws.getCell(`C${row}`), blankIfEmpty(get("camg", "camg")));
  ws.getCell(`C${row}`).numFmt = "0.0";
  ws.getCell(`C${row}`).font = font({ bold: true });
  ws.getCell(`D${row}`).value = "charge basis";
  ws.getCell(`D${row}`).font = font({ size: 9, color: { argb: COLOURS.grey } });
  const mark = (from, to, text, align) => merge(row, col(from), col(to), text, { font: font({ size: 8, color: { argb: COLOURS.grey } }), alignment: { horizontal: align } });
  mark(STRIP_FIRST, STRIP_FIRST + 4, "0 %", "left");
  mark(STRIP_FIRST + 12, STRIP_FIRST + 17, "50 %", "center");
  mark(STRIP_LAST - 4, STRIP_LAST, "100 %", "right");
  rule(row);
  height(row, 15);
  row++;
  row = note(row, "The strip divides the exchange capacity among the cations in the order of the table, each cell a thirtieth of it; the key column gives each colour. Lab A's CEC is the lab's own: what the bases do not hold (acidity) was not measured and is grey. No band limits are drawn for cation shares: soilcell ships none (balance ratios have weak support as a basis for fertiliser decisions: Kopittke & Menzies 2007, Soil Sci. Soc. Am. J. 71:259-265).", 22);

  // ---- Lime plan ---------------------------------------------------------------------------
  section(row, "Lime plan", COLOURS.orange, COLOURS.black);
  row++;
  const limeRows = {};
  const limeLines = [
    ["method", "Method", `IF(${lab}="A","Sikora buffer table (SIKORA-OR2025) to pH "&${setRef("targetPh")},IF(${lab}="B","Al saturation (Cochrane et al. 1980) to "&${setRef("targetAlSat")}&" % Al, 0-"&${setRef("depthB")}&" cm",""))`, null, null],
    ["caco3", "Lime requirement as pure CaCO3", blankIfEmpty(get("lime", "lime")), `"t/ha"`, "0.00"],
    ["product", "Product (from the paddock plan)", null, null, null],
    ["cce", "CCE of the product", `IFERROR(VLOOKUP($C$#product,${productTable},2,FALSE),"")`, `"%"`, "0"],
    ["fine", "Fineness efficiency (SOIL.FINENESS)", `IFERROR(VLOOKUP($C$#product,${productTable},8,FALSE),"")`, `"%"`, "0.0"],
    ["moist", "Moisture as received", `IFERROR(VLOOKUP($C$#product,${productTable},3,FALSE),"")`, `"%"`, "0"],
    ["rate", "Product rate (SOIL.LIMEPRODUCT)", `SOIL.LIMEPRODUCT(C#caco3,C#cce,C#fine,C#moist)`, `"t/ha as received"`, "0.00"],
    ["total", "Product for the paddock", `IF(ISNUMBER(C#rate),C#rate*${get("area", "area")},"")`, `"t"`, "0.0"],
  ];
  limeLines.forEach(([k], i) => (limeRows[k] = row + i));
  for (const [k, name, f, unit, fmt] of limeLines) {
    label(`B${row}`, name, { color: { argb: COLOURS.black } });
    const c = ws.getCell(`C${row}`);
    if (k === "product") {
      // The paddock's own product (from the paddock plan), which the consultant may overwrite to compare.
      formula(c, blankIfEmpty(get("product", "product")));
      c.fill = fill(COLOURS.tintYellow);
      c.border = { top: thin(COLOURS.black), bottom: thin(COLOURS.black), left: thin(COLOURS.black), right: thin(COLOURS.black) };
      ws.mergeCells(`C${row}:D${row}`);
      ws.dataValidations.add(`C${row}`, { type: "list", allowBlank: false, formulae: [`${productTable.replace(/\$H\$/, "$A$")}`] });
      c.font = font();
    } else {
      formula(c, f.replace(/#(\w+)/g, (_, x) => String(limeRows[x])));
      if (fmt) c.numFmt = fmt;
      c.font = font(k === "rate" || k === "total" ? { bold: true, size: 12 } : k === "method" ? {} : { bold: true });
    }
    if (k === "method") ws.mergeCells(`C${row}:${L}${row}`);
    if (unit) {
      formula(ws.getCell(`D${row}`), unit);
      ws.getCell(`D${row}`).font = font({ size: 9, color: { argb: COLOURS.grey } });
    }
    if (k === "rate" || k === "total") c.fill = fill(COLOURS.tintOrange);
    rule(row);
    height(row, k === "rate" || k === "total" ? 18 : 16);
    row++;
  }
  row = note(row, "Handle liming materials with care (dust; burnt and hydrated lime are caustic). Split large single applications, incorporate to the depth the rate is for, and time lime ahead of the crop.", 14);

  // ---- Methods and sources -----------------------------------------------------------------
  section(row, "Methods and sources", COLOURS.grey);
  row++;
  const source = (cell) => `IF(${cell}="","",INDEX(${bands.sources},MATCH(${cell},${bands.ids},0)))`;
  const [pT, kT, sT, znT] = tableCells;
  const methods = [
    { text: `"Cation exchange (SOIL.CEC, SOIL.SATURATION, SOIL.ESP): "&SOIL.ABOUT("SATURATION")`, max: about.aboutFunction("SATURATION").length + 60 },
    { text: `"Bands, phosphorus ("&${pT}&"): "&${source(pT)}`, max: 460 },
    { text: `IF(${lab}="A","Bands, potassium ("&${kT}&"): "&${source(kT)},IF(${lab}="B","Bands, sulfur ("&${sT}&"): "&${source(sT)},""))`, max: 470 },
    { text: `IF(${lab}="B","Bands, DTPA zinc (copper and manganese from the same source's table): "&${source(znT)},"Band words by SOIL.SUFFICIENCY from its built-in tables; SOIL.BANDPOS places each result on its table's scale.")`, max: 500 },
    { text: `IF(${lab}="B","Lime (SOIL.LIMEALSAT): "&SOIL.ABOUT("LIMEALSAT"),"Lime (SOIL.LIMEBUFFER, SIKORA-OR2025): Moore, A. (2025) Updated lime requirement recommendations for Oregon, Oregon State University Extension Service EM 9585, Table 1 (6-inch layer, tons/acre, converted to t/ha).")`, max: about.aboutFunction("LIMEALSAT").length + 30 },
    { text: `"Product rate (SOIL.LIMEPRODUCT): "&SOIL.ABOUT("LIMEPRODUCT")`, max: about.aboutFunction("LIMEPRODUCT").length + 40 },
  ];
  for (const m of methods) {
    const c = merge(row, "B", L, { formula: m.text }, { font: font({ size: 7 }), alignment: { wrapText: true, vertical: "top" } });
    void c;
    // Fixed heights (the batch fits the page at a scale found from them): lines of about 200
    // characters at 7 points across the page (about 230 fit in LibreOffice's rendering: seen).
    height(row, Math.ceil(m.max / 200) * 9 + 2);
    row++;
  }
  merge(row, "B", L, { formula: `"Computed by "&SOIL.VERSION()&" from the laboratory's results; prepared by ${SCENARIO.consultancy}. Invented data for a demonstration."` }, { font: font({ size: 8, color: { argb: COLOURS.grey } }) });
  height(row, 13);
  row++;
  merge(row, "B", L, `${about.CAUTION} Lime and fertiliser rates can hurt crops, soils, water and people if misapplied; lime needs handling care, and large single applications should be split.`, {
    font: font({ bold: true, size: 9, color: { argb: COLOURS.vermillion } }),
    alignment: { wrapText: true, vertical: "top" },
    border: { top: { style: "medium", color: { argb: COLOURS.vermillion } } },
  });
  height(row, 26);
  const lastRow = row;

  // ---- The convention's other names: found, file, group, figures ------------------------------
  ws.getCell(`${FIG_LABEL}1`).value = "Report_Found";
  formula(ws.getCell(`${FIG_VALUE}1`), `${lab}<>""`);
  ws.getCell(`${FIG_LABEL}2`).value = "Report_File";
  formula(ws.getCell(`${FIG_VALUE}2`), `IF(${lab}="","",$C$4&" "&${factCell.Paddock})`);
  ws.getCell(`${FIG_LABEL}3`).value = "Report_Group";
  formula(ws.getCell(`${FIG_VALUE}3`), `IF(${lab}="","",${factCell.Farm})`);
  const figures = [
    ["Farm", factCell.Farm, null],
    ["Paddock", factCell.Paddock, null],
    ["Laboratory", "E4", null],
    ["Area (ha)", factCell["Area (ha)"], "0.0"],
    ["pH (water)", "C12", "0.0"],
    ["P band", "E15", null],
    ["K band", "E16", null],
    ["S band", "E17", null],
    ["Lime as CaCO3 (t/ha)", `C${limeRows.caco3}`, "0.00"],
    ["Product", `C${limeRows.product}`, null],
    ["Product rate (t/ha)", `C${limeRows.rate}`, "0.00"],
    ["Product for the paddock (t)", `C${limeRows.total}`, "0.0"],
  ];
  const figTop = 5;
  figures.forEach(([name, ref, fmt], i) => {
    ws.getCell(`${FIG_LABEL}${figTop + i}`).value = name;
    const c = ws.getCell(`${FIG_VALUE}${figTop + i}`);
    formula(c, `IF(${ref}="","",${ref})`);
    if (fmt) c.numFmt = fmt;
  });
  const sheetName = sheetRef(ws.name);
  wb.definedNames.add(`${sheetName}!$C$4`, "Report_Key");
  wb.definedNames.add(`${sheetName}!$${FIG_VALUE}$1`, "Report_Found");
  wb.definedNames.add(`${sheetName}!$${FIG_VALUE}$2`, "Report_File");
  wb.definedNames.add(`${sheetName}!$${FIG_VALUE}$3`, "Report_Group");
  wb.definedNames.add(`${sheetName}!$${FIG_LABEL}$${figTop}:$${FIG_VALUE}$${figTop + figures.length - 1}`, "Report_Figures");

  // Every row its own height: the batch finds the one-page scale from them.
  for (let r = 1; r <= lastRow; r++) ws.getRow(r).height = heights[r] ?? 16;
  ws.pageSetup = {
    paperSize: 9,
    orientation: "portrait",
    fitToPage: true,
    fitToWidth: 1,
    fitToHeight: 1,
    printArea: `A1:${col(MARGIN_RIGHT)}${lastRow}`,
    margins: { left: 0.5, right: 0.5, top: 0.55, bottom: 0.55, header: 0.3, footer: 0.3 },
  };
  ws.views = [{ showGridLines: false }];
  return { lastRow };
}

/** The list of keys: every Sample ID of both lab sheets, with its farm and paddock (formulas, so the list follows the lab sheets). */
function buildReportList(ws, wb, ctx) {
  const { A, B, labA, labB } = ctx;
  const labASheet = SCENARIO.labA.sheet;
  const labBSheet = SCENARIO.labB.sheet;
  ws.getCell("A1").value = "Reports: one per Sample ID below (the cells A4 down are named Report_Keys; soilcell report makes a page for each)";
  ws.getCell("A1").font = font({ bold: true, size: 12, color: { argb: COLOURS.blue } });
  ["Sample ID", "Farm", "Paddock", "Laboratory"].forEach((h, i) => {
    const c = ws.getCell(3, i + 1);
    c.value = h;
    c.font = font({ bold: true, color: { argb: COLOURS.white } });
    c.fill = fill(COLOURS.blue);
  });
  let row = 4;
  const add = (sheet, letters, n, labName) => {
    for (let i = 0; i < n; i++) {
      const src = 3 + i;
      formula(ws.getCell(`A${row}`), `${sheetRef(sheet)}!${letters.id}${src}`);
      formula(ws.getCell(`B${row}`), `${sheetRef(sheet)}!${letters.farm}${src}`);
      formula(ws.getCell(`C${row}`), `${sheetRef(sheet)}!${letters.paddock}${src}`);
      ws.getCell(`D${row}`).value = labName;
      row++;
    }
  };
  add(labASheet, A.letters, labA, SCENARIO.labA.name);
  add(labBSheet, B.letters, labB, SCENARIO.labB.name);
  [12, 16, 16, 28].forEach((w, i) => (ws.getColumn(i + 1).width = w));
  ws.views = [{ state: "frozen", ySplit: 3 }];
  wb.definedNames.add(`${sheetRef(ws.name)}!$A$4:$A$${row - 1}`, "Report_Keys");
  return { first: 4, last: row - 1 };
}

module.exports = { buildReport, buildReportList, STRIP_CELLS, BAND_FILLS, CATION_FILLS };
