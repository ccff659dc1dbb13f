/**
 * The legume N budget: legume crops and pastures of the invented farms, their shoot dry matter,
 * N %, %Ndfa (from SOIL.NDFA where δ15N was measured, otherwise a published group mean), grain
 * removal and the N credit to the next crop. All paddock data are invented (seeded).
 */
"use strict";
const ExcelJS = require("exceljs");
const { rng, round, SCENARIO, COLOURS, fill, thin, col, formula, readMe, fixDates } = require("./common");

const FIRST_ROW = 3;

/**
 * %Ndfa group means used when no δ15N was measured. Source: Peoples, Giller, Jensen & Herridge
 * (2021) Plant and Soil 469:1-14, global mean %Ndfa by species group (seen, recorded as NFIX-14
 * in the project's published-values list).
 */
const NDFA_GROUP = {
  high: { pct: 74, text: "faba bean, lupin (and pigeonpea): 74 ± 11.8 %" },
  mid: { pct: 62, text: "pea, chickpea, lentil, vetch (and others): 62 ± 13.4 %" },
  soy: { pct: 61, text: "soybean outside Brazil and Europe: 61 ± 14.0 %" },
};

/**
 * Invented paddock-scale properties of each legume for the demo (not reference values). `word` is
 * the legume as the legume-check functions name it; `dig` the invented share of plants adequately
 * nodulated (low, high) and nodules per plant (low, high) of this season's root digs.
 */
const LEGUMES = {
  "faba bean": { use: "grain", dm: [6, 9], n: [2.8, 3.4], grain: [2.5, 4], grainN: 4.2, hi: 0.4, group: "high", root: "faba bean", b: -0.5, word: "faba bean", dig: { adequate: [0.55, 0.95], nodules: [35, 70] } },
  "field pea": { use: "grain", dm: [5, 7], n: [2.6, 3.2], grain: [2, 3], grainN: 3.7, hi: 0.45, group: "mid", root: "walley2007", b: -0.6, word: "field pea", dig: { adequate: [0.4, 0.9], nodules: [25, 65] } },
  lupin: { use: "grain", dm: [6, 8], n: [2.4, 3.0], grain: [1.8, 2.8], grainN: 5.5, hi: 0.3, group: "high", root: "walley2007", b: -0.8, word: "lupin", dig: { adequate: [0.6, 0.95], nodules: [15, 40] } },
  chickpea: { use: "grain", dm: [3.5, 5], n: [2.2, 2.8], grain: [1.5, 2.2], grainN: 3.4, hi: 0.4, group: "mid", root: "chickpea", b: -1.0, word: "chickpea", dig: { adequate: [0.35, 0.85], nodules: [10, 30] } },
  lentil: { use: "grain", dm: [3, 4.5], n: [2.6, 3.2], grain: [1.2, 1.8], grainN: 4.0, hi: 0.38, group: "mid", root: "walley2007", b: -0.7, word: "lentil", dig: { adequate: [0.3, 0.85], nodules: [20, 50] } },
  soybean: { use: "grain", dm: [6, 8], n: [2.7, 3.3], grain: [3, 4], grainN: 6.0, hi: 0.45, group: "soy", root: "shoot", b: -1.5, word: "soybean", dig: { adequate: [0, 0.5], nodules: [0, 25] } },
  "vetch (brown manure)": { use: "brown manure", dm: [4, 6], n: [3.2, 3.8], grain: [0, 0], grainN: 0, hi: null, group: "mid", root: "walley2007", b: -0.6, word: "vetch", dig: { adequate: [0.5, 0.9], nodules: [30, 70] } },
  "subterranean clover pasture": { use: "pasture", dm: [4, 7], n: [3.4, 4.0], grain: [0, 0], grainN: 0, hi: null, group: null, root: null, b: null, word: "subterranean clover", dig: { adequate: [0.2, 0.8], nodules: [10, 35] } },
  "lucerne pasture": { use: "pasture", dm: [8, 12], n: [3.2, 3.8], grain: [0, 0], grainN: 0, hi: null, group: null, root: null, b: null, word: "lucerne", dig: { adequate: [0.3, 0.8], nodules: [10, 30] } },
};

const PLAN = [
  ["Ambergully", ["faba bean", "faba bean", "faba bean", "field pea", "field pea", "lupin", "lupin", "subterranean clover pasture", "subterranean clover pasture"]],
  ["Tarnaby Flats", ["chickpea", "chickpea", "chickpea", "lentil", "lentil", "lentil", "vetch (brown manure)", "lucerne pasture", "lucerne pasture"]],
  ["Mistlecombe", ["lupin", "lupin", "lupin", "faba bean", "faba bean", "field pea", "subterranean clover pasture", "subterranean clover pasture"]],
  ["Wrenhollow", ["soybean", "soybean", "soybean"]],
  ["Quondle Hill", ["soybean"]],
];

function legumeWorkbook(build) {
  const { about, layout, legumes } = build;
  const H = layout.HEADERS;
  const r = rng(20251104);
  const rows = [];
  for (const [farmName, crops] of PLAN) {
    const farm = [...SCENARIO.farmsA, ...SCENARIO.farmsB].find((f) => f.name === farmName);
    crops.forEach((crop, i) => {
      const L = LEGUMES[crop];
      const pasture = L.use === "pasture";
      const isotope = !pasture && r.chance(0.6);
      const cut = pasture || L.use === "brown manure" || r.chance(0.6);
      const grain = L.use === "grain" ? round(r.uniform(...L.grain), 2) : 0;
      const ref = round(r.uniform(4, 8), 1);
      const ndfaTarget = r.uniform(0.45, 0.9);
      rows.push({
        id: `${farm.code}-${String(3 + i * 3).padStart(2, "0")}`,
        farm: farm.name,
        area: round(r.uniform(15, 90), 1),
        crop,
        use: L.use,
        dmCut: cut ? round(r.uniform(...L.dm), 1) : null,
        grain,
        hi: !cut ? L.hi : null,
        n: round(r.uniform(...L.n), 2),
        ref: isotope ? ref : null,
        leg: isotope ? round(ref - ndfaTarget * (ref - L.b), 1) : null,
        b: isotope ? L.b : null,
        assumed: !isotope && L.group ? NDFA_GROUP[L.group].pct : null,
        root: L.root,
        grainN: L.use === "grain" ? round(L.grainN + r.normal(0, 0.2), 2) : 0,
      });
    });
  }

  const wb = new ExcelJS.Workbook();
  fixDates(wb);
  wb.title = `${SCENARIO.district} legume N budget ${SCENARIO.season}`;
  const wsRead = wb.addWorksheet("Read me", { properties: { tabColor: { argb: COLOURS.blue } } });
  const ws = wb.addWorksheet(layout.SHEETS.legume, { properties: { tabColor: { argb: COLOURS.green } } });
  const wsNod = wb.addWorksheet(layout.SHEETS.nodulation, { properties: { tabColor: { argb: COLOURS.green } } });
  const wsDiff = wb.addWorksheet("N-difference check", { properties: { tabColor: { argb: COLOURS.sky } } });
  const wsTot = wb.addWorksheet(layout.SHEETS.legumeTotals, { properties: { tabColor: { argb: COLOURS.green } } });
  const wsAss = wb.addWorksheet("Assumptions", { properties: { tabColor: { argb: COLOURS.sky } } });

  // --- Assumptions ------------------------------------------------------------------------
  wsAss.getColumn(1).width = 34;
  wsAss.getColumn(2).width = 12;
  wsAss.getColumn(3).width = 110;
  wsAss.getCell("A1").value = "Assumptions used where nothing was measured";
  wsAss.getCell("A1").font = { bold: true, size: 13, color: { argb: COLOURS.blue } };
  const ass = [
    ["%Ndfa, faba bean and lupin", NDFA_GROUP.high.pct, `Peoples, Giller, Jensen & Herridge (2021) Plant and Soil 469:1-14, global mean by group: ${NDFA_GROUP.high.text}`],
    ["%Ndfa, pea, chickpea, lentil, vetch", NDFA_GROUP.mid.pct, `Same source: ${NDFA_GROUP.mid.text}`],
    ["%Ndfa, soybean", NDFA_GROUP.soy.pct, `Same source: ${NDFA_GROUP.soy.text}`],
    ["Below-ground factor, other pulses", "walley2007", "SOIL.NFIXED root_factor word: whole-plant N / shoot N = 1/(1 - 0.24), root N 14 % and rhizodeposit N 10 % of plant N (Walley et al. 2007, pulses of the Northern Great Plains)."],
    ["Below-ground factor, faba bean and chickpea", "faba bean, chickpea", "SOIL.NFIXED root_factor crop words: 1/(1 - share) with below-ground N 30 % (faba bean) and 48 % (chickpea) of total plant N (Khan et al. 2002, Plant and Soil, glasshouse pots)."],
    ["Below-ground factor, soybean", "shoot", "No sourced factor is built in for soybean: shoots only, so the fixed N is an underestimate."],
    ["Pastures", "pasture", "SOIL.NFIXDM rule: 20 kg shoot N fixed per t of legume herbage dry matter (Peoples et al. 2012, Crop & Pasture Science 63:759-786), shoots only."],
    ["B values", "", "Invented for this demo (values between -0.5 and -1.5 per mil). Use the B value published for your species and plant part, or one you measured."],
    ["Harvest index, shoot N %, grain N %", "", "Invented paddock data for the demo."],
    ["Root digs (Nodulation and soil)", "", "Invented: 30 plants per paddock (10 at each of 3 spots, as the University of Adelaide grower guide samples), plants scored adequate, nodules counted and cut open."],
    ["Soil test at sowing (Nodulation and soil)", "", "Invented: pH in CaCl2 (0-10 cm), nitrate-N at sowing for the crops (not measured under the pastures), hot-water B for lucerne only. Screened by SOIL.FIXSOIL against published levels (SOIL.ABOUT(\"FIXSOIL\"))."],
    ["N credit to the next crop", "", "Net N balance (fixed N minus grain N), 0 when negative. Not all of it reaches the next crop in one season: no recovery factor is applied."],
  ];
  ass.forEach(([a, b, c], i) => {
    wsAss.getCell(`A${3 + i}`).value = a;
    wsAss.getCell(`B${3 + i}`).value = b;
    wsAss.getCell(`C${3 + i}`).value = c;
    wsAss.getCell(`C${3 + i}`).alignment = { wrapText: true };
  });

  // --- Budget -----------------------------------------------------------------------------
  const cols = [
    { key: "id", header: H.sampleId, width: 10, value: (s) => s.id },
    { key: "farm", header: H.farm, width: 13, value: (s) => s.farm },
    { key: "area", header: H.area, width: 8, value: (s) => s.area },
    { key: "crop", header: "Legume", width: 24, value: (s) => s.crop },
    { key: "use", header: "Use", width: 12, value: (s) => s.use },
    { key: "dmCut", header: "Shoot DM, peak cut (t/ha)", width: 10, value: (s) => s.dmCut },
    { key: "grain", header: "Grain yield (t/ha)", width: 9, value: (s) => s.grain },
    { key: "hi", header: "Harvest index", width: 8, value: (s) => s.hi },
    { key: "dm", header: "Shoot DM used (t/ha)", width: 9, numFmt: "0.0", soil: true, row: (A) => `IF(${A("dmCut")}<>"",${A("dmCut")},SOIL.SHOOTDM(${A("grain")},${A("hi")}))` },
    { key: "n", header: "Shoot N (%)", width: 8, value: (s) => s.n },
    { key: "ref", header: "δ15N reference (‰)", width: 9, value: (s) => s.ref },
    { key: "leg", header: "δ15N legume (‰)", width: 9, value: (s) => s.leg },
    { key: "b", header: "B value (‰)", width: 8, value: (s) => s.b },
    { key: "ndfa15", header: "%Ndfa, 15N natural abundance", width: 11, numFmt: "0", soil: true, spill: (S) => `SOIL.NDFA(${S("ref")},${S("leg")},${S("b")})` },
    { key: "assumed", header: "%Ndfa assumed (Assumptions)", width: 11, value: (s) => s.assumed },
    { key: "ndfa", header: "%Ndfa used", width: 8, numFmt: "0", soil: true, row: (A) => `IF(ISNUMBER(${A("ndfa15")}),${A("ndfa15")},IF(${A("assumed")}="","",${A("assumed")}))` },
    { key: "root", header: "Below-ground factor", width: 11, value: (s) => s.root },
    {
      key: "fixed", header: "N fixed (kg N/ha)", width: 9, numFmt: "0", soil: true,
      row: (A, s) => (s.use === "pasture" ? `SOIL.NFIXDM(${A("dm")},"pasture")` : `SOIL.NFIXED(${A("dm")},${A("n")},${A("ndfa")},${A("root")})`),
    },
    { key: "method", header: "How N fixed was estimated", width: 30, value: (s) => (s.use === "pasture" ? "per-tonne rule (pasture)" : s.ref !== null ? "shoot N x %Ndfa (15N) x factor" : "shoot N x %Ndfa (assumed) x factor") },
    { key: "grainN", header: "Grain N (%)", width: 8, value: (s) => s.grainN },
    { key: "removed", header: "Grain N removed (kg N/ha)", width: 9, numFmt: "0", soil: true, row: (A) => `${A("grain")}*${A("grainN")}*10` },
    { key: "balance", header: H.nBalance, width: 10, numFmt: "0", soil: true, spill: (S) => `SOIL.NBALANCE(${S("fixed")},${S("grain")},${S("grainN")})` },
    { key: "credit", header: "N credit to next crop (kg N/ha)", width: 11, numFmt: "0", soil: true, row: (A) => `IF(ISNUMBER(${A("balance")}),MAX(0,${A("balance")}),"")` },
    { key: "fixedKg", header: "N fixed, paddock (kg N)", width: 11, numFmt: "#,##0", soil: true, row: (A) => `IF(ISNUMBER(${A("fixed")}),${A("fixed")}*${A("area")},"")` },
    { key: "creditKg", header: "N credit, paddock (kg N)", width: 11, numFmt: "#,##0", soil: true, row: (A) => `IF(ISNUMBER(${A("credit")}),${A("credit")}*${A("area")},"")` },
  ];
  const letters = {};
  cols.forEach((c, i) => (letters[c.key] = col(i + 1)));
  const lastRow = FIRST_ROW + rows.length - 1;
  ws.mergeCells(1, 1, 1, cols.length);
  ws.getCell("A1").value = `Legume N budget, ${SCENARIO.season}: ${SCENARIO.consultancy}`;
  ws.getCell("A1").font = { bold: true, size: 13, color: { argb: COLOURS.white } };
  ws.getCell("A1").fill = fill(COLOURS.green);
  cols.forEach((c, i) => {
    const h = ws.getCell(2, i + 1);
    h.value = c.header;
    h.font = { bold: true, color: { argb: c.soil ? COLOURS.white : COLOURS.black } };
    h.fill = fill(c.soil ? COLOURS.blue : COLOURS.tintGreen);
    h.alignment = { wrapText: true, vertical: "middle", horizontal: "center" };
    ws.getColumn(i + 1).width = c.width;
  });
  ws.getRow(2).height = 48;
  ws.views = [{ state: "frozen", xSplit: 1, ySplit: 2 }];
  rows.forEach((s, i) => {
    const row = FIRST_ROW + i;
    const A = (key) => `${letters[key]}${row}`;
    cols.forEach((c) => {
      const cell = ws.getCell(A(c.key));
      if (c.value) {
        const v = c.value(s);
        if (v !== null && v !== undefined) cell.value = v;
      } else if (c.row) formula(cell, c.row(A, s));
      else if (c.spill && i === 0) formula(cell, c.spill((key) => `${letters[key]}${FIRST_ROW}:${letters[key]}${lastRow}`));
      if (c.numFmt) cell.numFmt = c.numFmt;
      if (c.soil && c.spill) cell.fill = fill(COLOURS.tintBlue);
    });
  });
  const balRef = `${letters.balance}${FIRST_ROW}:${letters.balance}${lastRow}`;
  ws.addConditionalFormatting({
    ref: balRef,
    rules: [
      { type: "cellIs", operator: "lessThan", priority: 1, formulae: ["0"], style: { fill: { type: "pattern", pattern: "solid", bgColor: { argb: COLOURS.tintVermillion } }, font: { bold: true } } },
    ],
  });
  ws.addConditionalFormatting({
    ref: `${letters.fixed}${FIRST_ROW}:${letters.fixed}${lastRow}`,
    rules: [{ type: "dataBar", priority: 2, minLength: 0, maxLength: 100, gradient: false, cfvo: [{ type: "num", value: 0 }, { type: "num", value: 300 }], color: { argb: COLOURS.green } }],
  });
  const noteRow = lastRow + 2;
  [
    "Light blue columns hold one spilling formula each (SOIL.NDFA, SOIL.NBALANCE); white formula columns are per row (SOIL.SHOOTDM, SOIL.NFIXED, SOIL.NFIXDM).",
    "Shoot DM used: the peak-biomass cut where there is one, otherwise grain yield / harvest index (SOIL.SHOOTDM, which is shoot DM at maturity: leaf fall makes it an underestimate).",
    "A negative N balance (shaded) means the grain removed more N than the crop fixed: the crop drew on soil N.",
    about.CAUTION,
  ].forEach((t, i) => {
    ws.getCell(`A${noteRow + i}`).value = t;
    ws.getCell(`A${noteRow + i}`).font = i === 3 ? { bold: true, color: { argb: COLOURS.vermillion } } : { italic: true, color: { argb: COLOURS.grey } };
  });

  // --- N-difference check -----------------------------------------------------------------
  const diff = rows.filter((s) => s.dmCut !== null && s.use === "grain").slice(0, 4);
  wsDiff.getCell("A1").value = "N-difference check: legume strips against an adjacent wheat strip (invented measurements)";
  wsDiff.getCell("A1").font = { bold: true, size: 13, color: { argb: COLOURS.blue } };
  const dh = [H.sampleId, "Legume", "Legume shoot N (kg N/ha)", "Wheat shoot N (kg N/ha)", "Soil mineral N after legume (kg N/ha)", "Soil mineral N after wheat (kg N/ha)", "N fixed, N difference (kg N/ha)", "N fixed in shoots, budget sheet (kg N/ha)"];
  dh.forEach((h, i) => {
    const c = wsDiff.getCell(3, i + 1);
    c.value = h;
    c.font = { bold: true, color: { argb: i >= 6 ? COLOURS.white : COLOURS.black } };
    c.fill = fill(i >= 6 ? COLOURS.blue : COLOURS.tintGreen);
    c.alignment = { wrapText: true, vertical: "middle", horizontal: "center" };
    wsDiff.getColumn(i + 1).width = i === 1 ? 14 : 14;
  });
  wsDiff.getRow(3).height = 48;
  const budget = (key, idRef) => `INDEX('${layout.SHEETS.legume}'!$${letters[key]}$${FIRST_ROW}:$${letters[key]}$${lastRow},MATCH(${idRef},'${layout.SHEETS.legume}'!$A$${FIRST_ROW}:$A$${lastRow},0))`;
  diff.forEach((s, i) => {
    const row = 4 + i;
    wsDiff.getCell(`A${row}`).value = s.id;
    formula(wsDiff.getCell(`B${row}`), budget("crop", `A${row}`));
    const legN = s.dmCut * s.n * 10;
    wsDiff.getCell(`C${row}`).value = Math.round(legN);
    wsDiff.getCell(`D${row}`).value = Math.round(r.uniform(45, 75));
    wsDiff.getCell(`E${row}`).value = Math.round(r.uniform(50, 80));
    wsDiff.getCell(`F${row}`).value = Math.round(r.uniform(30, 50));
    formula(wsDiff.getCell(`H${row}`), `${budget("dm", `A${row}`)}*${budget("n", `A${row}`)}*10*${budget("ndfa", `A${row}`)}/100`);
    wsDiff.getCell(`H${row}`).numFmt = "0";
  });
  formula(wsDiff.getCell("G4"), `SOIL.NDIFF(C4:C${3 + diff.length},D4:D${3 + diff.length},E4:E${3 + diff.length},F4:F${3 + diff.length})`);
  for (let i = 0; i < diff.length; i++) {
    wsDiff.getCell(`G${4 + i}`).numFmt = "0";
    wsDiff.getCell(`G${4 + i}`).fill = fill(COLOURS.tintBlue);
  }
  wsDiff.getCell(`A${6 + diff.length}`).value =
    "N difference = legume N - reference N + (soil N after legume - soil N after reference). The two estimates differ in what they count: compare them, do not average them.";
  wsDiff.getCell(`A${6 + diff.length}`).font = { italic: true, color: { argb: COLOURS.grey } };

  // --- Nodulation and soil -----------------------------------------------------------------
  nodulationSheet(wsNod, rows, { about, layout, legumes });

  // --- Farm totals ------------------------------------------------------------------------
  const th = [H.farm, H.legumePaddocks, "Legume area (ha)", H.nFixedTotal, H.nCreditTotal, "Paddocks with negative balance"];
  wsTot.getCell("A1").value = "Legume N per farm";
  wsTot.getCell("A1").font = { bold: true, size: 13, color: { argb: COLOURS.blue } };
  th.forEach((h, i) => {
    const c = wsTot.getCell(3, i + 1);
    c.value = h;
    c.font = { bold: true, color: { argb: COLOURS.white } };
    c.fill = fill(COLOURS.green);
    c.alignment = { wrapText: true, vertical: "middle", horizontal: "center" };
    wsTot.getColumn(i + 1).width = i === 0 ? 16 : 14;
  });
  wsTot.getRow(3).height = 32;
  const span = (key) => `'${layout.SHEETS.legume}'!$${letters[key]}$${FIRST_ROW}:$${letters[key]}$${lastRow}`;
  PLAN.forEach(([farm], i) => {
    const row = 4 + i;
    wsTot.getCell(`A${row}`).value = farm;
    formula(wsTot.getCell(`B${row}`), `COUNTIF(${span("farm")},A${row})`);
    formula(wsTot.getCell(`C${row}`), `SUMIF(${span("farm")},A${row},${span("area")})`);
    formula(wsTot.getCell(`D${row}`), `SUMIF(${span("farm")},A${row},${span("fixedKg")})`);
    formula(wsTot.getCell(`E${row}`), `SUMIF(${span("farm")},A${row},${span("creditKg")})`);
    formula(wsTot.getCell(`F${row}`), `COUNTIFS(${span("farm")},A${row},${span("balance")},"<0")`);
    for (const c of ["C", "D", "E"]) wsTot.getCell(`${c}${row}`).numFmt = "#,##0";
  });
  const tr = 4 + PLAN.length;
  wsTot.getCell(`A${tr}`).value = "All farms";
  for (const c of ["B", "C", "D", "E", "F"]) {
    formula(wsTot.getCell(`${c}${tr}`), `SUM(${c}4:${c}${tr - 1})`);
    wsTot.getCell(`${c}${tr}`).numFmt = "#,##0";
  }
  wsTot.getRow(tr).font = { bold: true };
  wsTot.getRow(tr).border = { top: thin(COLOURS.black) };

  // --- Read me ----------------------------------------------------------------------------
  readMe(wsRead, `${SCENARIO.consultancy}: legume N budget, ${SCENARIO.season}`, [
    ["An invented scenario for trying soilcell: the consultancy, farms, paddocks and every measurement are made up.", "n"],
    ["What is in this workbook", "h"],
    [`${layout.SHEETS.legume}: ${rows.length} legume crops and pastures with shoot dry matter, shoot N %, %Ndfa (SOIL.NDFA from δ15N where sampled, otherwise the group mean on Assumptions), fixed N (SOIL.NFIXED, or SOIL.NFIXDM for pastures), grain removal and the net N balance (SOIL.NBALANCE).`, "n"],
    [`${layout.SHEETS.nodulation}: this season's root digs (30 plants per paddock about 10-12 weeks after sowing) rated by SOIL.NODPCT, SOIL.NODRATING, SOIL.NODPINK and SOIL.NODCOUNT, and the soil test at sowing screened for the conditions that stop fixation (SOIL.FIXSOIL, SOIL.FIXSOILCOUNT). The digs and soil tests are invented.`, "n"],
    ["N-difference check: four paddocks with a wheat reference strip, fixed N by SOIL.NDIFF beside the budget's shoot estimate. Farm totals: fixed N and N credit per farm. Assumptions: every value that was not measured, with its source or marked invented.", "n"],
    ["Caution", "h"],
    [`${about.CAUTION} An N credit is an estimate of what the legume leaves, not a fertiliser recommendation: soil tests, the season and local advice decide the next crop's N. The nodulation ratings and soil screen are screening aids: an inoculant's label and local advice govern.`, "c"],
  ]);

  return { wb, facts: { paddocks: rows.length } };
}

/**
 * The "Nodulation and soil" sheet: one row per budget paddock with an invented root dig (30
 * plants, as the University of Adelaide grower guide samples) and an invented soil test at sowing,
 * rated and screened by the legume-check functions. Its own seed, so the budget's data stay as
 * they were.
 */
function nodulationSheet(ws, rows, { about, layout, legumes }) {
  const H = layout.HEADERS;
  const r = rng(20251105);
  const digs = rows.map((s) => {
    const L = LEGUMES[s.crop];
    const dug = 30;
    // One uninoculated soybean paddock with no nodules at all, so the sheet shows a None.
    const none = s.farm === "Quondle Hill";
    const adequate = none ? 0 : Math.round(dug * r.uniform(...L.dig.adequate));
    const nodules = none ? 0 : Math.max(adequate, Math.round(dug * r.uniform(...L.dig.nodules)));
    const crop = L.use === "grain" || L.use === "brown manure";
    return {
      id: s.id,
      farm: s.farm,
      crop: s.crop,
      word: L.word,
      dug,
      adequate,
      nodules,
      pink: Math.round(nodules * r.uniform(0.5, 0.95)),
      ph: round(r.uniform(4.6, 6.9), 1),
      nitrate: crop ? Math.round(r.uniform(20, 150)) : null,
      boron: L.word === "lucerne" ? round(r.uniform(0.2, 0.9), 2) : null,
      hasCount: Boolean(legumes.legumeOf(L.word).count),
    };
  });
  const first = FIRST_ROW;
  const last = first + digs.length - 1;
  const cols = [
    { key: "id", header: H.sampleId, width: 10, value: (d) => d.id },
    { key: "farm", header: H.farm, width: 13, value: (d) => d.farm },
    { key: "crop", header: "Legume", width: 24, value: (d) => d.crop },
    { key: "word", header: "Legume, as the checks name it", width: 18, value: (d) => d.word },
    { key: "dug", header: "Plants dug", width: 7, value: (d) => d.dug },
    { key: "adequate", header: "Plants adequately nodulated", width: 10, value: (d) => d.adequate },
    { key: "nodules", header: "Nodules counted", width: 9, value: (d) => d.nodules },
    { key: "pink", header: "Nodules pink inside", width: 9, value: (d) => d.pink },
    { key: "pct", header: "% of plants adequately nodulated", width: 11, numFmt: "0", soil: true, spill: (S) => `SOIL.NODPCT(${S("dug")},${S("adequate")})` },
    { key: "rating", header: H.nodRating, width: 40, soil: true, spill: (S) => `SOIL.NODRATING(${S("dug")},${S("adequate")},${S("nodules")})` },
    { key: "pinkPct", header: "% of nodules pink (effective)", width: 11, numFmt: "0", soil: true, row: (A) => `IF(${A("nodules")}=0,"no nodules",SOIL.NODPINK(${A("nodules")},${A("pink")}))` },
    {
      key: "count", header: "Nodules per plant against the published count", width: 40, soil: true,
      row: (A, d) => (d.hasCount ? `SOIL.NODCOUNT(${A("dug")},${A("nodules")},${A("word")})` : null),
      value: (d) => (d.hasCount ? undefined : "no published count for this legume"),
    },
    { key: "ph", header: "Soil pH (CaCl2), 0-10 cm", width: 8, value: (d) => d.ph },
    { key: "nitrate", header: "Nitrate-N at sowing (kg N/ha)", width: 10, value: (d) => d.nitrate },
    { key: "boron", header: "Hot-water B (mg/kg)", width: 8, value: (d) => d.boron },
    { key: "screen", header: H.soilScreen, width: 60, soil: true, spill: (S) => `SOIL.FIXSOIL(${S("word")},${S("ph")},"CaCl2",${S("nitrate")},${S("boron")})` },
    { key: "constraints", header: H.soilConstraints, width: 10, numFmt: "0", soil: true, spill: (S) => `SOIL.FIXSOILCOUNT(${S("word")},${S("ph")},"CaCl2",${S("nitrate")},${S("boron")})` },
  ];
  const letters = {};
  cols.forEach((c, i) => (letters[c.key] = col(i + 1)));
  ws.mergeCells(1, 1, 1, cols.length);
  ws.getCell("A1").value = `Root digs and soil conditions for fixation, ${SCENARIO.season}: ${SCENARIO.consultancy} (invented data)`;
  ws.getCell("A1").font = { bold: true, size: 13, color: { argb: COLOURS.white } };
  ws.getCell("A1").fill = fill(COLOURS.green);
  cols.forEach((c, i) => {
    const h = ws.getCell(2, i + 1);
    h.value = c.header;
    h.font = { bold: true, color: { argb: c.soil ? COLOURS.white : COLOURS.black } };
    h.fill = fill(c.soil ? COLOURS.blue : COLOURS.tintGreen);
    h.alignment = { wrapText: true, vertical: "middle", horizontal: "center" };
    ws.getColumn(i + 1).width = c.width;
  });
  ws.getRow(2).height = 48;
  ws.views = [{ state: "frozen", xSplit: 1, ySplit: 2 }];
  digs.forEach((d, i) => {
    const row = first + i;
    const A = (key) => `${letters[key]}${row}`;
    cols.forEach((c) => {
      const cell = ws.getCell(A(c.key));
      const f = c.row ? c.row(A, d) : null;
      if (f) formula(cell, f);
      else if (c.value) {
        const v = c.value(d);
        if (v !== null && v !== undefined) cell.value = v;
      } else if (c.spill && i === 0) formula(cell, c.spill((key) => `${letters[key]}${first}:${letters[key]}${last}`));
      if (c.numFmt) cell.numFmt = c.numFmt;
      if (c.soil && c.spill) cell.fill = fill(COLOURS.tintBlue);
      if (c.key === "screen" || c.key === "rating" || c.key === "count") cell.alignment = { wrapText: false };
    });
  });
  ws.addConditionalFormatting({
    ref: `${letters.constraints}${first}:${letters.constraints}${last}`,
    rules: [{ type: "cellIs", operator: "greaterThan", priority: 1, formulae: ["0"], style: { fill: { type: "pattern", pattern: "solid", bgColor: { argb: COLOURS.tintVermillion } }, font: { bold: true } } }],
  });
  ws.addConditionalFormatting({
    ref: `${letters.rating}${first}:${letters.rating}${last}`,
    rules: [{ type: "expression", priority: 2, formulae: [`OR(LEFT(${letters.rating}${first},4)="Poor",LEFT(${letters.rating}${first},4)="None")`], style: { fill: { type: "pattern", pattern: "solid", bgColor: { argb: COLOURS.tintVermillion } }, font: { bold: true } } }],
  });
  const noteRow = last + 2;
  [
    "Light blue columns hold one spilling formula each (SOIL.NODPCT, SOIL.NODRATING, SOIL.FIXSOIL, SOIL.FIXSOILCOUNT); the pink share and the count check are per row (SOIL.NODCOUNT only where a source gives a per-plant count for the legume).",
    "Rating scale: University of Adelaide grower guide to assessing legume nodulation (Adequate 70 % or more of plants adequate, Borderline 50-70 %, Poor under 50 %, None: no nodules). Soil levels and their sources: SOIL.ABOUT(\"FIXSOIL\").",
    "pH is in CaCl2 and says so in the formula: a level published for one pH test is never applied to the other. Blank nitrate or B: not measured, listed as not checked.",
    "Screening aids only: an inoculant's label and local advice govern. " + about.CAUTION,
  ].forEach((t, i) => {
    ws.getCell(`A${noteRow + i}`).value = t;
    ws.getCell(`A${noteRow + i}`).font = i === 3 ? { bold: true, color: { argb: COLOURS.vermillion } } : { italic: true, color: { argb: COLOURS.grey } };
  });
  return digs;
}

module.exports = { legumeWorkbook };
