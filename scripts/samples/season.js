/**
 * The season workbook: two labs' deliveries of an invented autumn sampling, interpreted with SOIL
 * formulas (spilling columns and per-row formulas), a farm summary, the lime products, the band
 * tables used, and a one-page client report template. All data are invented (seeded).
 */
"use strict";
const ExcelJS = require("exceljs");
const { rng, round, clamp, SCENARIO, PADDOCK_WORDS, COLOURS, fill, thin, col, sheetRef, formula, readMe, fixDates } = require("./common");
const { buildReport, buildReportList } = require("./report");

const FIRST_ROW = 3; // row 1: column groups, row 2: headers, data from row 3

/**
 * @param {object} build the compiled modules: { chemistry, sufficiency, about, layout }
 * @returns the workbook and facts the caller reports
 */
function seasonWorkbook(build) {
  const { chemistry, sufficiency, about, layout } = build;
  const H = layout.HEADERS;
  const r = rng(20250318);
  const eq = (ion) => chemistry.mgPerCmol(ion); // mg/kg per cmol(+)/kg (= ppm per meq/100 g)

  // ---------------------------------------------------------------------------------------
  // Invented data

  const paddockName = (i) => PADDOCK_WORDS[i % PADDOCK_WORDS.length] + (i >= PADDOCK_WORDS.length ? ` ${Math.floor(i / PADDOCK_WORDS.length) + 1}` : "");

  const labA = [];
  let seq = 1041;
  for (const farm of SCENARIO.farmsA) {
    for (let i = 0; i < farm.samples; i++) {
      const ph = round(clamp(r.normal(6.3, 0.45), 4.9, 7.6), 1);
      const buffer = ph < 6.7 ? round(clamp(6.95 - (6.7 - ph) * 0.45 + r.normal(0, 0.06), 5.4, 6.9), 2) : null;
      const cec = clamp(r.lognormal(13, 0.35), 4.2, 32);
      const bs = clamp(45 + (ph - 5.0) * 28 + r.normal(0, 5), 35, 99) / 100;
      const kPpm = Math.round(clamp(r.lognormal(135, 0.4), 40, 450));
      const naMeq = clamp(r.lognormal(0.12, 0.4), 0.03, 0.6);
      const bases = cec * bs;
      const caMeq = Math.max(0.5, (bases - kPpm / eq("K") - naMeq) * r.uniform(0.72, 0.82));
      const mgMeq = Math.max(0.2, bases - kPpm / eq("K") - naMeq - caMeq);
      const p = Math.round(clamp(r.lognormal(24, 0.55), 3, 150));
      labA.push({
        id: `${farm.code}-${String(i + 1).padStart(2, "0")}`,
        labNo: `B25-${String(seq++).padStart(5, "0")}`,
        farm: farm.name,
        paddock: paddockName(i),
        sampled: new Date(Date.UTC(2025, 2, 3 + Math.floor(r.uniform(0, 24)))),
        depth: "0-6",
        ph,
        buffer,
        om: round(r.lognormal(3.0, 0.3), 1),
        pBray: farm.pMethod === "Bray-1" ? p : null,
        pM3: farm.pMethod === "Mehlich-3" ? p : null,
        k: kPpm,
        ca: Math.round(caMeq * eq("Ca")),
        mg: Math.round(mgMeq * eq("Mg")),
        na: Math.round(naMeq * eq("Na")),
        cec: round(cec, 1),
        no3: round(r.lognormal(14, 0.5), 1),
        s: round(r.lognormal(8, 0.35), 1),
        area: round(r.uniform(8, 45), 1),
        crop: r.chance(0.5) ? "corn" : "soybean",
        rotation: farm.rotation,
        product: farm.product,
      });
    }
  }

  const labB = [];
  seq = 311807;
  for (const farm of SCENARIO.farmsB) {
    for (let i = 0; i < farm.samples; i++) {
      const phCa = round(clamp(r.normal(5.05, 0.55), 4.0, 7.0), 1);
      const ecec = clamp(r.lognormal(7, 0.4), 2.5, 20);
      const alSat = phCa < 4.9 ? clamp((4.9 - phCa) * 30 + r.normal(0, 3), 1, 45) : r.uniform(0.2, 1.2);
      const al = Math.max(0.01, round((ecec * alSat) / 100, 2));
      const colwellK = Math.round(clamp(r.lognormal(160, 0.45), 40, 600));
      const rest = ecec - al;
      const na = rest * r.uniform(0.01, 0.06);
      const k = (colwellK / eq("K")) * r.uniform(0.8, 1.1);
      const ca = (rest - na - k) * r.uniform(0.66, 0.78);
      const mg = Math.max(0.1, rest - na - k - ca);
      labB.push({
        id: `${farm.code}-${String(i + 1).padStart(2, "0")}`,
        labNo: `Q${seq++}`,
        farm: farm.name,
        paddock: paddockName(i),
        sampled: new Date(Date.UTC(2025, 3, 1 + Math.floor(r.uniform(0, 26)))),
        depth: "0-10",
        phCa,
        phW: round(phCa + r.uniform(0.5, 0.8), 1),
        oc: round(r.lognormal(1.2, 0.3), 2),
        colwellP: Math.round(clamp(r.lognormal(32, 0.45), 5, 140)),
        colwellK,
        s: round(r.lognormal(7, 0.4), 1),
        no3: round(r.lognormal(9, 0.5), 1),
        ca: round(ca, 2),
        mg: round(mg, 2),
        k: round(k, 2),
        na: round(na, 2),
        al,
        area: round(r.uniform(20, 110), 1),
        crop: r.chance(0.55) ? "wheat" : "canola",
        bd: round(farm.bulkDensity + r.normal(0, 0.04), 2),
        product: farm.product,
      });
    }
  }

  // Lab B's DTPA micronutrients, from a second seeded generator so the values above are unchanged.
  // A DTPA Mn of exactly 1.0 is avoided: its source classifies that value in neither band.
  const r2 = rng(20250402);
  for (const s of labB) {
    s.zn = round(clamp(r2.lognormal(0.9, 0.6), 0.1, 6), 2);
    s.cu = round(clamp(r2.lognormal(0.8, 0.5), 0.1, 5), 2);
    const mn = round(clamp(r2.lognormal(6, 0.9), 0.3, 60), 1);
    s.mn = mn === 1 ? 1.1 : mn;
  }
  for (const s of labB) for (const k of ["zn", "cu", "mn"]) if (r2.chance(0.03)) s[k] = null;

  // Real exports have gaps and the odd value typed as text. The report's paddock stays complete.
  const reportSample = labA.find((s) => s.farm === "Wrenhollow" && s.pM3 !== null && s.pM3 < 20 && s.buffer !== null && s.ph >= 5.6 && s.ph < 6.3 && s.k >= 122 && s.k < 168 && s.cec > 5);
  const holes = (list, keys, p) => {
    for (const s of list) {
      if (s === reportSample) continue;
      for (const k of keys) if (r.chance(p)) s[k] = null;
    }
  };
  holes(labA, ["om", "k", "na", "s", "no3"], 0.03);
  holes(labA, ["pM3", "pBray"], 0.02);
  holes(labB, ["oc", "colwellK", "s", "no3", "na"], 0.03);
  holes(labB, ["colwellP"], 0.02);
  const asText = (list, key, indexes) => {
    for (const i of indexes) if (list[i][key] !== null && list[i] !== reportSample) list[i][key] = String(list[i][key]);
  };
  asText(labA, "ca", [5, 88]);
  asText(labA, "k", [17, 121]);
  asText(labA, "pM3", [3, 90]);
  asText(labA, "ph", [47]);
  asText(labB, "colwellP", [12, 77]);
  asText(labB, "ca", [30, 101]);
  asText(labB, "phCa", [64]);
  // Below-detection values as the labs print them: read by SOIL.LABVALUE with the Settings policy.
  const detectA = labA[57];
  const detectB = labB[93];
  detectA.no3 = "<0.5";
  detectB.no3 = "<0.5";

  // ---------------------------------------------------------------------------------------
  // Workbook

  const wb = new ExcelJS.Workbook();
  fixDates(wb);
  wb.title = `${SCENARIO.district} soil tests ${SCENARIO.season}`;
  wb.subject = "Invented sample data for soilcell";
  const wsRead = wb.addWorksheet("Read me", { properties: { tabColor: { argb: COLOURS.blue } } });
  const wsReport = wb.addWorksheet("Client report", { properties: { tabColor: { argb: COLOURS.green } } });
  const wsFarms = wb.addWorksheet(layout.SHEETS.farms, { properties: { tabColor: { argb: COLOURS.green } } });
  const wsA = wb.addWorksheet(SCENARIO.labA.sheet, { properties: { tabColor: { argb: COLOURS.orange } } });
  const wsB = wb.addWorksheet(SCENARIO.labB.sheet, { properties: { tabColor: { argb: COLOURS.orange } } });
  const wsProducts = wb.addWorksheet("Lime products", { properties: { tabColor: { argb: COLOURS.sky } } });
  const wsBands = wb.addWorksheet("Bands", { properties: { tabColor: { argb: COLOURS.sky } } });
  const wsSet = wb.addWorksheet("Settings", { properties: { tabColor: { argb: COLOURS.sky } } });
  const wsList = wb.addWorksheet("Report list", { properties: { tabColor: { argb: COLOURS.green } } });

  // --- Settings ---------------------------------------------------------------------------
  const SET = { targetPh: "$C$4", targetAlSat: "$C$5", depthB: "$C$6", belowDetection: "$C$7" };
  const setRef = (k) => `Settings!${SET[k]}`;
  wsSet.getColumn(2).width = 62;
  wsSet.getColumn(3).width = 10;
  wsSet.getColumn(4).width = 90;
  wsSet.getCell("B2").value = "Settings used by the lab sheets and the report";
  wsSet.getCell("B2").font = { bold: true, size: 13, color: { argb: COLOURS.blue } };
  const settings = [
    ["Target soil pH, Lab A paddocks (SIKORA-OR2025 buffer table, 6-inch layer)", 6.4, "Consultant's target for a corn-soybean rotation (invented for the demo). The table accepts targets 5.6 to 7.2."],
    ["Target Al saturation, Lab B paddocks (% of Al + Ca + Mg)", 5, "Consultant's policy for canola-wheat paddocks (invented for the demo). Crops differ in Al tolerance: check local advice."],
    ["Depth to lime, Lab B paddocks (cm)", 10, "The sampled layer (0-10 cm). The Cochrane method's own layer is 20 cm; a rate is proportional to the depth limed."],
    ["Below-detection lab results, e.g. \"<0.5\" (SOIL.LABVALUE policy: limit, half, zero or blank)", "half", "Consultant's choice for the demo (invented): half the detection limit. Zero is the cautious choice where soil nitrate is credited against N fertiliser. Without a policy LABVALUE refuses the value: nothing is assumed."],
  ];
  settings.forEach(([label, v, note], i) => {
    const row = 4 + i;
    wsSet.getCell(`B${row}`).value = label;
    const c = wsSet.getCell(`C${row}`);
    c.value = v;
    c.fill = fill(COLOURS.tintYellow);
    c.border = { top: thin(), bottom: thin(), left: thin(), right: thin() };
    wsSet.getCell(`D${row}`).value = note;
    wsSet.getCell(`D${row}`).font = { italic: true, color: { argb: COLOURS.grey } };
  });

  // --- Lime products ----------------------------------------------------------------------
  const P_FIRST = 4;
  const P_LAST = P_FIRST + SCENARIO.products.length - 1;
  const productTable = `${sheetRef("Lime products")}!$A$${P_FIRST}:$H$${P_LAST}`;
  wsProducts.getCell("A1").value = "Liming products on the price list (invented products, invented analyses)";
  wsProducts.getCell("A1").font = { bold: true, size: 13, color: { argb: COLOURS.blue } };
  const ph = ["Product", "CCE (%)", "Moisture (%)", "Finer than 60 mesh (%)", "20-60 mesh (%)", "8-20 mesh (%)", "Coarser than 8 mesh (%)", "Fineness efficiency (%)", "Kind"];
  ph.forEach((h, i) => {
    const c = wsProducts.getCell(3, i + 1);
    c.value = h;
    c.font = { bold: true, color: { argb: COLOURS.white } };
    c.fill = fill(COLOURS.blue);
    c.alignment = { wrapText: true, vertical: "middle" };
  });
  wsProducts.getRow(3).height = 32;
  SCENARIO.products.forEach((p, i) => {
    const row = P_FIRST + i;
    wsProducts.getCell(`A${row}`).value = p.name;
    wsProducts.getCell(`B${row}`).value = p.cce;
    wsProducts.getCell(`C${row}`).value = p.moisture;
    p.fractions.forEach((f, j) => (wsProducts.getCell(row, 4 + j).value = f));
    formula(wsProducts.getCell(`H${row}`), `SOIL.FINENESS(D${row}:G${row})`);
    wsProducts.getCell(`H${row}`).numFmt = "0.0";
    wsProducts.getCell(`I${row}`).value = p.kind;
  });
  [26, 9, 12, 13, 11, 11, 13, 13, 24].forEach((w, i) => (wsProducts.getColumn(i + 1).width = w));
  wsProducts.getCell(`A${P_LAST + 2}`).value =
    "Fineness efficiency by SOIL.FINENESS with its default four-class rating (100/60/20/0 %). Burnt and hydrated lime are caustic: none is listed here.";
  wsProducts.getCell(`A${P_LAST + 2}`).font = { italic: true, color: { argb: COLOURS.grey } };

  // --- Bands (the built-in tables this workbook uses, copied from the add-in's own data) ---
  const tables = sufficiency.sufficiencyTables();
  const BAND_IDS = [
    "sare-bray1-p",
    "tristate2020-m3-p-corn-soybean",
    "tristate2020-m3-p-wheat-alfalfa",
    "tristate2020-m3-k-cec-5-or-less",
    "tristate2020-m3-k-cec-above-5",
    "grdc2020-colwell-p-wheat",
    "grdc2020-colwell-p-canola",
    "anderson2013-kcl40-s-wheat",
    "anderson2013-kcl40-s-canola",
    "havlin1999-dtpa-zn",
    "havlin1999-dtpa-cu",
    "havlin1999-dtpa-mn",
  ];
  const bandRow = {};
  const bandHead = ["Table", "Nutrient", "Method", "Crops", "CEC condition", "Limit 1", "Limit 2", "Limit 3", "Labels", "Edge rule (the source's)", "Source"];
  wsBands.getCell("A1").value = "Band limits used for SOIL.BANDPOS (copied from the add-in's reference tables; SOIL.SUFFICIENCY reads the same tables)";
  wsBands.getCell("A1").font = { bold: true, size: 13, color: { argb: COLOURS.blue } };
  bandHead.forEach((h, i) => {
    const c = wsBands.getCell(3, i + 1);
    c.value = h;
    c.font = { bold: true, color: { argb: COLOURS.white } };
    c.fill = fill(COLOURS.blue);
  });
  BAND_IDS.forEach((id, i) => {
    const t = tables.find((x) => x.id === id);
    if (!t) throw new Error(`band table ${id} is not in the add-in's data`);
    const row = 4 + i;
    bandRow[id] = { row, limits: t.limits.length, range: `Bands!$F$${row}:$${col(5 + t.limits.length)}$${row}` };
    wsBands.getCell(`A${row}`).value = t.id;
    wsBands.getCell(`B${row}`).value = t.nutrient;
    wsBands.getCell(`C${row}`).value = t.method;
    wsBands.getCell(`D${row}`).value = t.covers;
    wsBands.getCell(`E${row}`).value = t.cec;
    t.limits.forEach((l, j) => (wsBands.getCell(row, 6 + j).value = l));
    wsBands.getCell(`I${row}`).value = t.labels.join(" | ");
    wsBands.getCell(`J${row}`).value = t.edgeRule;
    wsBands.getCell(`K${row}`).value = t.source;
  });
  [36, 9, 11, 30, 18, 8, 8, 8, 60, 90, 120].forEach((w, i) => (wsBands.getColumn(i + 1).width = w));
  const bandNote = 4 + BAND_IDS.length + 1;
  wsBands.getCell(`A${bandNote}`).value =
    "Position on the band scale (SOIL.BANDPOS): 0 at the first limit, 1 at the second, and so on; below 0 is the band under the first limit, which this workbook counts as below optimum. BANDPOS draws bars only: the band word, with the source's own rule for a value on a limit, comes from SOIL.SUFFICIENCY.";
  wsBands.getCell(`A${bandNote}`).font = { italic: true, color: { argb: COLOURS.grey } };

  // --- Lab sheets -------------------------------------------------------------------------
  const last = (list) => FIRST_ROW + list.length - 1;

  /** Lays out one lab sheet from a column list; returns key → column letter. */
  function labSheet(ws, list, title, columns) {
    const letters = {};
    columns.forEach((c, i) => (letters[c.key] = col(i + 1)));
    const lastRow = last(list);
    const at = (key, row) => `${letters[key]}${row}`;
    const span = (key) => `${letters[key]}${FIRST_ROW}:${letters[key]}${lastRow}`;
    const groups = { lab: [title, COLOURS.orange, COLOURS.black], plan: [`Paddock plan (${SCENARIO.consultancy})`, COLOURS.sky, COLOURS.black], soil: [layout.SOIL_GROUP, COLOURS.blue, COLOURS.white] };
    let start = 0;
    columns.forEach((c, i) => {
      const head = ws.getCell(2, i + 1);
      head.value = c.header;
      const [, bg, fg] = groups[c.group];
      head.font = { bold: true, color: { argb: fg } };
      head.fill = fill(bg);
      head.alignment = { wrapText: true, vertical: "middle", horizontal: "center" };
      head.border = { bottom: thin(COLOURS.black) };
      ws.getColumn(i + 1).width = c.width ?? 10;
      const next = columns[i + 1];
      if (!next || next.group !== c.group) {
        ws.mergeCells(1, start + 1, 1, i + 1);
        const g = ws.getCell(1, start + 1);
        g.value = groups[c.group][0];
        g.font = { bold: true, color: { argb: fg } };
        g.fill = fill(bg);
        g.alignment = { horizontal: "left", vertical: "middle" };
        start = i + 1;
      }
    });
    ws.getRow(1).height = 20;
    ws.getRow(2).height = 46;
    ws.views = [{ state: "frozen", xSplit: 1, ySplit: 2 }];
    list.forEach((s, i) => {
      const row = FIRST_ROW + i;
      columns.forEach((c) => {
        const cell = ws.getCell(`${letters[c.key]}${row}`);
        if (c.value) {
          const v = c.value(s);
          if (v !== null && v !== undefined) cell.value = v;
        } else if (c.row) {
          formula(cell, c.row((key) => at(key, row), row));
        } else if (c.spill && i === 0) {
          formula(cell, c.spill(span));
        }
        if (c.numFmt) cell.numFmt = c.numFmt;
        if (c.group === "soil") cell.fill = fill(c.spill ? COLOURS.tintBlue : COLOURS.white);
        if (c.align) cell.alignment = { horizontal: c.align };
      });
    });
    // Band cells tinted by position: below optimum, in the optimum band, above it.
    for (const [label, pos] of columns.filter((c) => c.bandOf).map((c) => [c.key, c.bandOf])) {
      const ref = `${letters[label]}${FIRST_ROW}:${letters[pos]}${lastRow}`;
      const p = `$${letters[pos]}${FIRST_ROW}`;
      ws.addConditionalFormatting({
        ref,
        rules: [
          { type: "expression", priority: 1, formulae: [`AND(ISNUMBER(${p}),${p}<0)`], style: { fill: { type: "pattern", pattern: "solid", bgColor: { argb: COLOURS.tintVermillion } } } },
          { type: "expression", priority: 2, formulae: [`AND(ISNUMBER(${p}),${p}>=0,${p}<1)`], style: { fill: { type: "pattern", pattern: "solid", bgColor: { argb: COLOURS.tintGreen } } } },
          { type: "expression", priority: 3, formulae: [`AND(ISNUMBER(${p}),${p}>=1)`], style: { fill: { type: "pattern", pattern: "solid", bgColor: { argb: COLOURS.tintSky } } } },
        ],
      });
    }
    ws.autoFilter = { from: { row: 2, column: 1 }, to: { row: 2, column: columns.length } };
    return { letters, lastRow, span: (key) => `$${letters[key]}$${FIRST_ROW}:$${letters[key]}$${lastRow}` };
  }

  const productCols = (rateRef) =>
    `SOIL.LIMEPRODUCT(${rateRef},VLOOKUP(#P,${productTable},2,FALSE),VLOOKUP(#P,${productTable},8,FALSE),VLOOKUP(#P,${productTable},3,FALSE))`;

  const colsA = [
    { key: "id", header: H.sampleId, group: "lab", width: 10, value: (s) => s.id },
    { key: "labNo", header: "Lab no.", group: "lab", width: 11, value: (s) => s.labNo },
    { key: "farm", header: H.farm, group: "lab", width: 13, value: (s) => s.farm },
    { key: "paddock", header: H.paddock, group: "lab", width: 12, value: (s) => s.paddock },
    { key: "sampled", header: "Sampled", group: "lab", width: 11, value: (s) => s.sampled, numFmt: "d mmm yyyy" },
    { key: "depth", header: "Depth (in)", group: "lab", width: 7, value: (s) => s.depth, align: "center" },
    { key: "ph", header: "pH (1:1 water)", group: "lab", width: 8, value: (s) => s.ph },
    { key: "buffer", header: "Buffer pH (Sikora)", group: "lab", width: 9, value: (s) => s.buffer },
    { key: "om", header: "OM (%)", group: "lab", width: 7, value: (s) => s.om },
    { key: "pBray", header: "P Bray-1 (ppm)", group: "lab", width: 8, value: (s) => s.pBray },
    { key: "pM3", header: "P Mehlich-3 (ppm)", group: "lab", width: 9, value: (s) => s.pM3 },
    { key: "k", header: "K Mehlich-3 (ppm)", group: "lab", width: 9, value: (s) => s.k },
    { key: "ca", header: "Ca (ppm)", group: "lab", width: 8, value: (s) => s.ca },
    { key: "mg", header: "Mg (ppm)", group: "lab", width: 8, value: (s) => s.mg },
    { key: "na", header: "Na (ppm)", group: "lab", width: 7, value: (s) => s.na },
    { key: "cec", header: "CEC (meq/100 g)", group: "lab", width: 9, value: (s) => s.cec },
    { key: "no3", header: "NO3-N (lb/ac)", group: "lab", width: 8, value: (s) => s.no3 },
    { key: "s", header: layout.ANALYTES.find((a) => a.key === "S").unbanded[0], group: "lab", width: 7, value: (s) => s.s },
    { key: "area", header: H.area, group: "plan", width: 8, value: (s) => s.area },
    { key: "crop", header: H.crop, group: "plan", width: 9, value: (s) => s.crop },
    { key: "rotation", header: H.rotation, group: "plan", width: 17, value: (s) => s.rotation },
    { key: "product", header: H.product, group: "plan", width: 19, value: (s) => s.product },
    { key: "cecSum", header: "CEC, sum of bases (cmol(+)/kg)", group: "soil", width: 11, numFmt: "0.0", spill: (S) => `SOIL.CEC(${S("ca")},${S("mg")},${S("k")},${S("na")},"ppm")` },
    { key: "bs", header: "Base saturation (% of lab CEC)", group: "soil", width: 11, numFmt: "0", spill: (S) => `SOIL.SATURATION("bases",${S("ca")},${S("mg")},${S("k")},${S("na")},"ppm",,${S("cec")})` },
    { key: "caPct", header: "Ca (% of lab CEC)", group: "soil", width: 9, numFmt: "0", spill: (S) => `SOIL.SATURATION("Ca",${S("ca")},${S("mg")},${S("k")},${S("na")},"ppm",,${S("cec")})` },
    { key: "mgPct", header: "Mg (% of lab CEC)", group: "soil", width: 9, numFmt: "0", spill: (S) => `SOIL.SATURATION("Mg",${S("ca")},${S("mg")},${S("k")},${S("na")},"ppm",,${S("cec")})` },
    { key: "kPct", header: "K (% of lab CEC)", group: "soil", width: 9, numFmt: "0.0", spill: (S) => `SOIL.SATURATION("K",${S("ca")},${S("mg")},${S("k")},${S("na")},"ppm",,${S("cec")})` },
    { key: "esp", header: "ESP (%)", group: "soil", width: 7, numFmt: "0.0", row: (A) => `SOIL.ESP(${A("na")},${A("cec")},"ppm")` },
    { key: "camg", header: "Ca:Mg (charge)", group: "soil", width: 8, numFmt: "0.0", row: (A) => `SOIL.CAMG(${A("ca")},${A("mg")},"ppm")` },
    {
      key: "pBand", header: H.pBand, group: "soil", width: 14, bandOf: "pPos",
      row: (A) => `IF(${A("pM3")}<>"",SOIL.SUFFICIENCY("P",${A("pM3")},${A("rotation")},"Mehlich-3"),SOIL.SUFFICIENCY("P",${A("pBray")},,"Bray-1"))`,
    },
    {
      key: "pPos", header: H.pPos, group: "soil", width: 9, numFmt: "0.00",
      row: (A) =>
        `IF(${A("pM3")}<>"",IF(OR(ISNUMBER(SEARCH("wheat",${A("rotation")})),ISNUMBER(SEARCH("alfalfa",${A("rotation")}))),SOIL.BANDPOS(${A("pM3")},${bandRow["tristate2020-m3-p-wheat-alfalfa"].range}),SOIL.BANDPOS(${A("pM3")},${bandRow["tristate2020-m3-p-corn-soybean"].range})),SOIL.BANDPOS(${A("pBray")},${bandRow["sare-bray1-p"].range}))`,
    },
    { key: "kBand", header: H.kBand, group: "soil", width: 12, bandOf: "kPos", spill: (S) => `SOIL.SUFFICIENCY("K",${S("k")},${S("crop")},"Mehlich-3",${S("cec")})` },
    {
      key: "kPos", header: H.kPos, group: "soil", width: 9, numFmt: "0.00",
      row: (A) => `IF(${A("cec")}="","",IF(${A("cec")}<=5,SOIL.BANDPOS(${A("k")},${bandRow["tristate2020-m3-k-cec-5-or-less"].range}),SOIL.BANDPOS(${A("k")},${bandRow["tristate2020-m3-k-cec-above-5"].range})))`,
    },
    { key: "lime", header: H.limeCaco3, group: "soil", width: 10, numFmt: "0.00", spill: (S) => `SOIL.LIMEBUFFER(${S("buffer")},${setRef("targetPh")},"SIKORA-OR2025",${S("ph")},,"t/ha")` },
    { key: "limeProduct", header: H.limeProduct, group: "soil", width: 10, numFmt: "0.00", row: (A) => productCols(A("lime")).replace(/#P/g, A("product")) },
    { key: "limeT", header: H.limeTonnes, group: "soil", width: 10, numFmt: "0.0", row: (A) => `IF(ISNUMBER(${A("limeProduct")}),${A("limeProduct")}*${A("area")},"")` },
    { key: "no3kg", header: "NO3-N (kg/ha)", group: "soil", width: 9, numFmt: "0.0", spill: (S) => `SOIL.CONVERT(SOIL.LABVALUE(${S("no3")},${setRef("belowDetection")}),"lb/ac","kg/ha")` },
  ];

  const colsB = [
    { key: "id", header: H.sampleId, group: "lab", width: 10, value: (s) => s.id },
    { key: "labNo", header: "Lab no.", group: "lab", width: 10, value: (s) => s.labNo },
    { key: "farm", header: H.farm, group: "lab", width: 13, value: (s) => s.farm },
    { key: "paddock", header: H.paddock, group: "lab", width: 12, value: (s) => s.paddock },
    { key: "sampled", header: "Sampled", group: "lab", width: 11, value: (s) => s.sampled, numFmt: "d mmm yyyy" },
    { key: "depth", header: "Depth (cm)", group: "lab", width: 7, value: (s) => s.depth, align: "center" },
    { key: "phCa", header: "pH (CaCl2)", group: "lab", width: 7, value: (s) => s.phCa },
    { key: "phW", header: "pH (water)", group: "lab", width: 7, value: (s) => s.phW },
    { key: "oc", header: "Organic C (%)", group: "lab", width: 8, value: (s) => s.oc },
    { key: "colwellP", header: "Colwell P (mg/kg)", group: "lab", width: 8, value: (s) => s.colwellP },
    { key: "colwellK", header: layout.ANALYTES.find((a) => a.key === "K").unbanded[0], group: "lab", width: 8, value: (s) => s.colwellK },
    { key: "s", header: "S KCl-40, 0-30 cm (mg/kg)", group: "lab", width: 8, value: (s) => s.s },
    { key: "zn", header: "Zn DTPA (mg/kg)", group: "lab", width: 7, value: (s) => s.zn },
    { key: "cu", header: "Cu DTPA (mg/kg)", group: "lab", width: 7, value: (s) => s.cu },
    { key: "mn", header: "Mn DTPA (mg/kg)", group: "lab", width: 7, value: (s) => s.mn },
    { key: "no3", header: "Nitrate-N (mg/kg)", group: "lab", width: 8, value: (s) => s.no3 },
    { key: "ca", header: "Exch. Ca (cmol(+)/kg)", group: "lab", width: 9, value: (s) => s.ca },
    { key: "mg", header: "Exch. Mg (cmol(+)/kg)", group: "lab", width: 9, value: (s) => s.mg },
    { key: "k", header: "Exch. K (cmol(+)/kg)", group: "lab", width: 9, value: (s) => s.k },
    { key: "na", header: "Exch. Na (cmol(+)/kg)", group: "lab", width: 9, value: (s) => s.na },
    { key: "al", header: "Exch. Al (cmol(+)/kg)", group: "lab", width: 9, value: (s) => s.al },
    { key: "area", header: H.area, group: "plan", width: 8, value: (s) => s.area },
    { key: "crop", header: H.crop, group: "plan", width: 9, value: (s) => s.crop },
    { key: "bd", header: "Bulk density (g/cm3)", group: "plan", width: 9, value: (s) => s.bd },
    { key: "product", header: H.product, group: "plan", width: 19, value: (s) => s.product },
    { key: "ecec", header: "ECEC (cmol(+)/kg)", group: "soil", width: 10, numFmt: "0.0", spill: (S) => `SOIL.CEC(${S("ca")},${S("mg")},${S("k")},${S("na")},"cmol(+)/kg",${S("al")})` },
    { key: "alSat", header: "Al saturation (% of ECEC)", group: "soil", width: 10, numFmt: "0.0", spill: (S) => `SOIL.SATURATION("acidity",${S("ca")},${S("mg")},${S("k")},${S("na")},"cmol(+)/kg",${S("al")})` },
    { key: "caPct", header: "Ca (% of ECEC)", group: "soil", width: 9, numFmt: "0", spill: (S) => `SOIL.SATURATION("Ca",${S("ca")},${S("mg")},${S("k")},${S("na")},"cmol(+)/kg",${S("al")})` },
    { key: "mgPct", header: "Mg (% of ECEC)", group: "soil", width: 9, numFmt: "0", spill: (S) => `SOIL.SATURATION("Mg",${S("ca")},${S("mg")},${S("k")},${S("na")},"cmol(+)/kg",${S("al")})` },
    { key: "kPct", header: "K (% of ECEC)", group: "soil", width: 9, numFmt: "0.0", spill: (S) => `SOIL.SATURATION("K",${S("ca")},${S("mg")},${S("k")},${S("na")},"cmol(+)/kg",${S("al")})` },
    { key: "esp", header: "ESP (%)", group: "soil", width: 7, numFmt: "0.0", row: (A) => `SOIL.ESP(${A("na")},${A("ecec")},"cmol(+)/kg")` },
    { key: "camg", header: "Ca:Mg (charge)", group: "soil", width: 8, numFmt: "0.0", row: (A) => `SOIL.CAMG(${A("ca")},${A("mg")},"cmol(+)/kg")` },
    { key: "pBand", header: H.pBand, group: "soil", width: 16, bandOf: "pPos", spill: (S) => `SOIL.SUFFICIENCY("P",${S("colwellP")},${S("crop")},"Colwell")` },
    {
      key: "pPos", header: H.pPos, group: "soil", width: 9, numFmt: "0.00",
      row: (A) => `IF(${A("crop")}="canola",SOIL.BANDPOS(${A("colwellP")},${bandRow["grdc2020-colwell-p-canola"].range}),SOIL.BANDPOS(${A("colwellP")},${bandRow["grdc2020-colwell-p-wheat"].range}))`,
    },
    {
      key: "sBand", header: H.sBand, group: "soil", width: 15, bandOf: "sPos",
      spill: (S) =>
        // 0-30 cm cores (the column says so); the wheat table is read only when named (its sources disagree).
        `IF(${S("crop")}="wheat",SOIL.SUFFICIENCY("S",${S("s")},${S("crop")},"KCl-40",,"anderson2013-kcl40-s-wheat",,30),SOIL.SUFFICIENCY("S",${S("s")},${S("crop")},"KCl-40",,,,30))`,
    },
    {
      key: "sPos", header: H.sPos, group: "soil", width: 9, numFmt: "0.00",
      row: (A) => `IF(${A("crop")}="canola",SOIL.BANDPOS(${A("s")},${bandRow["anderson2013-kcl40-s-canola"].range}),SOIL.BANDPOS(${A("s")},${bandRow["anderson2013-kcl40-s-wheat"].range}))`,
    },
    { key: "znBand", header: H.znBand, group: "soil", width: 12, bandOf: "znPos", spill: (S) => `SOIL.SUFFICIENCY("Zn",${S("zn")},,"DTPA")` },
    { key: "znPos", header: H.znPos, group: "soil", width: 9, numFmt: "0.00", spill: (S) => `SOIL.BANDPOS(${S("zn")},${bandRow["havlin1999-dtpa-zn"].range})` },
    { key: "cuBand", header: H.cuBand, group: "soil", width: 12, bandOf: "cuPos", spill: (S) => `SOIL.SUFFICIENCY("Cu",${S("cu")},,"DTPA")` },
    { key: "cuPos", header: H.cuPos, group: "soil", width: 9, numFmt: "0.00", spill: (S) => `SOIL.BANDPOS(${S("cu")},${bandRow["havlin1999-dtpa-cu"].range})` },
    { key: "mnBand", header: H.mnBand, group: "soil", width: 12, spill: (S) => `SOIL.SUFFICIENCY("Mn",${S("mn")},,"DTPA")` },
    { key: "lime", header: H.limeCaco3, group: "soil", width: 10, numFmt: "0.00", spill: (S) => `SOIL.LIMEALSAT(${S("al")},${S("ca")},${S("mg")},${setRef("targetAlSat")},,${setRef("depthB")},${S("bd")})` },
    { key: "limeProduct", header: H.limeProduct, group: "soil", width: 10, numFmt: "0.00", row: (A) => productCols(A("lime")).replace(/#P/g, A("product")) },
    { key: "limeT", header: H.limeTonnes, group: "soil", width: 10, numFmt: "0.0", row: (A) => `IF(ISNUMBER(${A("limeProduct")}),${A("limeProduct")}*${A("area")},"")` },
    { key: "no3kg", header: "Nitrate-N (kg/ha, 0-10 cm)", group: "soil", width: 10, numFmt: "0.0", spill: (S) => `SOIL.CONVERT(SOIL.LABVALUE(${S("no3")},${setRef("belowDetection")}),"mg/kg","kg/ha",${setRef("depthB")},${S("bd")})` },
  ];

  const A = labSheet(wsA, labA, `${SCENARIO.labA.name}, report ${SCENARIO.labA.report} (as delivered)`, colsA);
  const B = labSheet(wsB, labB, `${SCENARIO.labB.name}, report ${SCENARIO.labB.report} (as delivered)`, colsB);
  const refA = (key) => `${sheetRef(SCENARIO.labA.sheet)}!${A.span(key)}`;
  const refB = (key) => `${sheetRef(SCENARIO.labB.sheet)}!${B.span(key)}`;

  // --- Farms ------------------------------------------------------------------------------
  const farmHead = [H.farm, H.lab, H.samples, "Area sampled (ha)", H.product, H.needLime, H.limeTonnes, H.pBelow, H.kBelow, H.sBelow, H.znBelow, H.cuBelow, H.mnBelow];
  // A sample below optimum is in the first band of its table: the band word SOIL.SUFFICIENCY gives there.
  const firstBand = (id) => tables.find((t) => t.id === id).labels[0];
  wsFarms.getCell("A1").value = `Farms: ${SCENARIO.district} ${SCENARIO.season} sampling (${SCENARIO.consultancy})`;
  wsFarms.getCell("A1").font = { bold: true, size: 14, color: { argb: COLOURS.blue } };
  farmHead.forEach((h, i) => {
    const c = wsFarms.getCell(3, i + 1);
    c.value = h;
    c.font = { bold: true, color: { argb: COLOURS.white } };
    c.fill = fill(COLOURS.blue);
    c.alignment = { wrapText: true, vertical: "middle", horizontal: "center" };
  });
  wsFarms.getRow(3).height = 32;
  [16, 28, 9, 11, 20, 11, 12, 11, 11, 11, 11, 11, 11].forEach((w, i) => (wsFarms.getColumn(i + 1).width = w));
  const farmRows = [...SCENARIO.farmsA.map((f) => [f, "A"]), ...SCENARIO.farmsB.map((f) => [f, "B"])];
  farmRows.forEach(([f, lab], i) => {
    const row = 4 + i;
    const ref = lab === "A" ? refA : refB;
    wsFarms.getCell(`A${row}`).value = f.name;
    wsFarms.getCell(`B${row}`).value = lab === "A" ? SCENARIO.labA.name : SCENARIO.labB.name;
    formula(wsFarms.getCell(`C${row}`), `COUNTIF(${ref("farm")},A${row})`);
    formula(wsFarms.getCell(`D${row}`), `SUMIF(${ref("farm")},A${row},${ref("area")})`);
    wsFarms.getCell(`E${row}`).value = f.product;
    formula(wsFarms.getCell(`F${row}`), `COUNTIFS(${ref("farm")},A${row},${ref("limeT")},">0")`);
    formula(wsFarms.getCell(`G${row}`), `SUMIF(${ref("farm")},A${row},${ref("limeT")})`);
    formula(wsFarms.getCell(`H${row}`), `COUNTIFS(${ref("farm")},A${row},${ref("pPos")},"<0")`);
    if (lab === "A") {
      formula(wsFarms.getCell(`I${row}`), `COUNTIFS(${ref("farm")},A${row},${ref("kPos")},"<0")`);
      wsFarms.getCell(`J${row}`).value = "no table";
      for (const c of ["K", "L", "M"]) wsFarms.getCell(`${c}${row}`).value = "not tested";
    } else {
      wsFarms.getCell(`I${row}`).value = "no table";
      formula(wsFarms.getCell(`J${row}`), `COUNTIFS(${ref("farm")},A${row},${ref("sBand")},"${firstBand("anderson2013-kcl40-s-wheat")}")`);
      formula(wsFarms.getCell(`K${row}`), `COUNTIFS(${ref("farm")},A${row},${ref("znBand")},"${firstBand("havlin1999-dtpa-zn")}")`);
      formula(wsFarms.getCell(`L${row}`), `COUNTIFS(${ref("farm")},A${row},${ref("cuBand")},"${firstBand("havlin1999-dtpa-cu")}")`);
      formula(wsFarms.getCell(`M${row}`), `COUNTIFS(${ref("farm")},A${row},${ref("mnBand")},"${firstBand("havlin1999-dtpa-mn")}")`);
    }
    wsFarms.getCell(`D${row}`).numFmt = "0.0";
    wsFarms.getCell(`G${row}`).numFmt = "0.0";
  });
  const totalRow = 4 + farmRows.length;
  wsFarms.getCell(`A${totalRow}`).value = "All farms";
  for (const c of ["C", "D", "F", "G", "H", "I", "J", "K", "L", "M"]) {
    formula(wsFarms.getCell(`${c}${totalRow}`), `SUM(${c}4:${c}${totalRow - 1})`);
    wsFarms.getCell(`${c}${totalRow}`).numFmt = c === "D" || c === "G" ? "0.0" : "0";
  }
  wsFarms.getRow(totalRow).font = { bold: true };
  wsFarms.getRow(totalRow).border = { top: thin(COLOURS.black) };
  const notes = [
    "Lime to spread is product as received (SOIL.LIMEPRODUCT: CCE, fineness and moisture from the Lime products sheet) times paddock area.",
    "Lab A paddocks: SIKORA-OR2025 buffer table to the target pH on Settings (0 where the soil pH is already at the target). Lab B paddocks: Al-saturation method to the target on Settings.",
    "Below optimum: the paddock's value lies in the first band of its reference table (band position below 0; see Bands). Colwell K has no table (no readable source), nor has Lab A's sulfate-S (its extraction is not named). Lab B's S is a 0-30 cm core, the depth of the KCl-40 tables.",
    about.CAUTION,
  ];
  notes.forEach((t, i) => {
    const c = wsFarms.getCell(`A${totalRow + 2 + i}`);
    c.value = t;
    c.font = i === notes.length - 1 ? { bold: true, color: { argb: COLOURS.vermillion } } : { italic: true, color: { argb: COLOURS.grey } };
  });
  wsFarms.views = [{ state: "frozen", ySplit: 3 }];

  // --- Client report ----------------------------------------------------------------------
  const bandRange = (c) => `Bands!$${c}$4:$${c}$${3 + BAND_IDS.length}`;
  const bands = { ids: bandRange("A"), limits: `Bands!$F$4:$H$${3 + BAND_IDS.length}`, sources: bandRange("K") };
  buildReport(wsReport, wb, { refA, refB, reportSample, productTable, setRef, bands, about });
  buildReportList(wsList, wb, { A, B, labA: labA.length, labB: labB.length });

  // --- Read me ----------------------------------------------------------------------------
  const no3A = `${A.letters.no3}${FIRST_ROW}:${A.letters.no3}${A.lastRow}`;
  const detectCellA = `${sheetRef(SCENARIO.labA.sheet)}!${A.letters.no3}${FIRST_ROW + labA.indexOf(detectA)}`;
  const readMeLines = [
    ["An invented scenario for trying soilcell: the consultancy, farms, paddocks, laboratories, products and every number are made up.", "n"],
    ["What is in this workbook", "h"],
    [`${SCENARIO.labA.sheet}: ${labA.length} samples as ${SCENARIO.labA.name} delivers them: ppm, meq/100 g and lb/ac, P by Bray-1 or Mehlich-3, Sikora buffer pH (run only below pH 6.7), 0-6 inch cores. The paddock plan gives each paddock's rotation: the Tri-State P critical level depends on it (20 ppm Mehlich-3 for corn-soybean, 30 ppm when wheat or alfalfa is in the rotation).`, "n"],
    [`${SCENARIO.labB.sheet}: ${labB.length} samples as ${SCENARIO.labB.name} delivers them: mg/kg and cmol(+)/kg, Colwell P and K, DTPA Zn, Cu and Mn, KCl-extractable Al, 0-10 cm cores, and KCl-40 sulfur on a 0-30 cm core; converted to kg/ha with the bulk density in the paddock plan.`, "n"],
    ["Farms: samples, lime to spread and paddocks below optimum per farm (COUNTIFS/SUMIF over the lab sheets). Client report: one page per paddock; type a Sample ID in the yellow cell. Each analyte sits on a band scale (a strip of the reference table's bands, lowest at left, the result marked by a black diamond), and the exchange complex is one strip shared among the cations.", "n"],
    ["Reports for the whole season: the yellow cell is named Report_Key and the Sample IDs on the Report list sheet Report_Keys (Formulas > Name Manager shows them, with Report_Found, Report_File, Report_Group and Report_Figures). npx soilcell report this-file.xlsx writes every paddock's page as a values-only workbook and a PDF, a folder and a PDF per farm, and an index.", "n"],
    ["Lime products: CCE, moisture and sieve fractions of the products on the price list; fineness efficiency by SOIL.FINENESS. Bands: the band limits used for SOIL.BANDPOS, with their sources. Settings: lime targets and the policy for below-detection results.", "n"],
    ["Two ways to write SOIL formulas", "h"],
    ["Columns shaded light blue hold ONE spilling formula in their first data row, e.g. =SOIL.CEC(M3:M152,N3:N152,L3:L152,O3:O152,\"ppm\"): the result fills the column. White interpretation columns hold one formula per row, e.g. =SOIL.CAMG(M3,N3,\"ppm\"). The unit is always written: a lab's ppm and meq/100 g differ 200-fold, so soilcell never assumes one.", "n"],
    ["What the lab files contain, as real exports do", "h"],
    ["Blank cells are analytes the lab did not report: the SOIL result is blank too (never 0). A few numbers arrived as text (\"12.5\"): SOIL functions read them as numbers.", "n"],
    [`Two nitrate values arrived as "<0.5" (${SCENARIO.labA.sheet} ${detectA.id}, ${SCENARIO.labB.sheet} ${detectB.id}). The nitrate columns read the lab's column through SOIL.LABVALUE with the policy named once on the Settings sheet (half the limit here), e.g. =SOIL.CONVERT(SOIL.LABVALUE(${no3A},Settings!$C$7),"lb/ac","kg/ha"): change the policy there and every below-detection result follows. LABVALUE also reads ">300", "n.d.", "trace", "1 250" and, with a stated decimal comma, "12,5".`, "n"],
    ["Without LABVALUE such a cell is refused, by design: soilcell never guesses a value below detection. The next line converts Lab A's \"<0.5\" directly and shows that #VALUE! and its message on purpose (it is the one error cell in this workbook):", "n"],
    [`SOIL.CONVERT(${detectCellA},"lb/ac","kg/ha")`, "f"],
    ["Recalculate without Excel", "h"],
    ["npx soilcell recalc this-file.xlsx writes a recalculated copy beside it; npm run demo recalculates every sample workbook into demo-output/ and prints a summary.", "n"],
    ["Caution", "h"],
    [`${about.CAUTION} Lime rates can hurt crops, soils and water if misapplied: split large applications, incorporate to the depth the rate is for, and handle liming materials with care (dust; burnt and hydrated lime are caustic).`, "c"],
  ];
  const readMeRows = readMe(wsRead, `${SCENARIO.consultancy}: ${SCENARIO.district} soil tests, ${SCENARIO.season}`, readMeLines);
  const refusalRow = readMeRows[readMeLines.findIndex(([, style]) => style === "f")];

  return {
    wb,
    facts: {
      samplesA: labA.length,
      samplesB: labB.length,
      reportSample: reportSample.id,
      // The one deliberate refusal: Lab A's "<0.5" converted without LABVALUE, on the Read me sheet.
      deliberateErrors: [{ sheet: "Read me", cell: `B${refusalRow}`, id: detectA.id }],
    },
  };
}

module.exports = { seasonWorkbook };
