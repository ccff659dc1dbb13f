/**
 * Invented consultant workbooks for consultant-attack.js: lab sheets in lab units, SOIL formulas
 * (Excel's stored form: _xldudf_SOIL_ID, dynamic-array cells) and native formulas downstream of
 * them. Every farm, paddock, lab and product is invented (demo data). A SOIL cell's cached value
 * is deliberately stale, so the cells downstream of it must change when recalculated.
 */
"use strict";

/** A SOIL cell: `SOIL.X(` written in Excel's stored form; ref set to its own address unless it spills. */
const S = (f, v = 1, ref) => ({ f: f.replace(/SOIL\.([A-Z0-9]+)\(/g, "_xldudf_SOIL_$1("), t: "array", cm: true, v, ref, soil: true });
/** A native dynamic-array formula (Excel 365 stores every formula typed there so only when it spills; here when it takes arrays). */
const DA = (f, ref) => ({ f, t: "array", cm: true, ref });
const F = (f, s) => (s === undefined ? { f } : { f, s });
const date = (y, m, d, d1904 = false) => {
  const serial = Math.round((Date.UTC(y, m - 1, d) - Date.UTC(1899, 11, 30)) / 86400000);
  return { n: d1904 ? serial - 1462 : serial, s: 1 };
};

/** Fills `cells` with one formula per row, the row number put in for {r}. */
function fill(cells, col, rows, make) {
  for (const r of rows) cells[`${col}${r}`] = make(r);
}
const range = (a, b) => Array.from({ length: b - a + 1 }, (_, i) => a + i);

function finish(book) {
  for (const s of book.sheets) {
    for (const [addr, spec] of Object.entries(s.cells)) {
      if (spec && typeof spec === "object" && spec.t === "array" && !spec.ref) spec.ref = addr;
      if (spec && typeof spec === "object") delete spec.soil;
    }
  }
  return book;
}

// ---------------------------------------------------------------- 1. Ardlow Downs: per-row SOIL, decisions, product table, per-farm summary
function ardlow() {
  const lab = {
    A1: "Paddock", B1: "Farm", C1: "Sampled", D1: "pH CaCl2", E1: "Sikora buffer pH", F1: "Ca mg/kg", G1: "Mg mg/kg", H1: "K mg/kg", I1: "Na mg/kg", J1: "Al cmol(+)/kg", K1: "Product",
  };
  const rows = [
    ["Top Flat", "Ardlow", [2025, 3, 4], 4.9, 5.6, 820, 140, 95, 30, 0.8, "Calcitic fine"],
    ["Creek", "Ardlow", [2025, 3, 4], 5.6, 6.3, 1650, 260, 180, 45, 0.1, "Dolomitic"],
    ["Back 40", "Ardlow", [2025, 3, 5], 5.1, 5.9, 1100, 210, 140, 35, 0.4, "Calcitic fine"],
    ["Bore", "Merrin Vale", [2025, 3, 11], 6.1, 6.7, 2400, 310, 260, 60, 0, "Dolomitic"],
    ["Ridge", "Merrin Vale", [2025, 3, 11], 4.8, 5.4, 640, 95, 70, 22, 1.1, "Calcitic coarse"],
    ["Swamp", "Merrin Vale", [2025, 3, 12], 5.4, 6.1, 1320, 420, 150, 80, 0.2, "Dolomitic"],
    ["House", "Ardlow", [2025, 3, 5], 5.8, 6.5, 1900, 180, 310, 40, 0.05, "Calcitic fine"],
    ["Long", "Merrin Vale", [2025, 3, 12], 5.0, 5.8, 980, 160, 110, 28, 0.6, "Calcitic coarse"],
  ];
  rows.forEach((r, i) => {
    const n = i + 2;
    ["A", "B"].forEach((c, j) => (lab[`${c}${n}`] = r[j]));
    lab[`C${n}`] = date(...r[2]);
    ["D", "E", "F", "G", "H", "I", "J"].forEach((c, j) => (lab[`${c}${n}`] = r[3 + j]));
    lab[`K${n}`] = r[10];
  });
  const calc = { A1: "Paddock", B1: "CEC", C1: "Ca sat %", D1: "Ca:Mg", E1: "Lime CaCO3 t/ha", F1: "Product t/ha", G1: "pH decision", H1: "Spread t/ha", I1: "Ca note", J1: "Line", K1: "Cost $/ha", L1: "Retest", M1: "K sat %", N1: "Mg flag" };
  for (const n of range(2, 9)) {
    const L = (c) => `'Lab A'!${c}${n}`;
    calc[`A${n}`] = F(`${L("A")}`);
    calc[`B${n}`] = S(`SOIL.CEC(${L("F")},${L("G")},${L("H")},${L("I")},"mg/kg",${L("J")})`, 5);
    calc[`C${n}`] = S(`SOIL.SATURATION("Ca",${L("F")},${L("G")},${L("H")},${L("I")},"mg/kg",${L("J")})`, 50);
    calc[`D${n}`] = S(`SOIL.CAMG(${L("F")},${L("G")},"mg/kg")`, 3);
    calc[`E${n}`] = S(`SOIL.LIMEBUFFER(${L("E")},TargetPH,"SIKORA-OR2025",,,"t/ha")`, 1);
    calc[`F${n}`] = S(`SOIL.LIMEPRODUCT(E${n},VLOOKUP(${L("K")},Products,2,FALSE),VLOOKUP(${L("K")},Products,3,FALSE))`, 1);
    calc[`G${n}`] = F(`IF(${L("D")}<5.5,"Apply lime","No lime")`);
    calc[`H${n}`] = F(`IF(G${n}="Apply lime",ROUNDUP(F${n}*4,0)/4,0)`);
    calc[`I${n}`] = F(`IF(C${n}<65,"Low Ca ("&ROUND(C${n},0)&"%)","Ca OK")`);
    calc[`J${n}`] = F(`A${n}&": CEC "&TEXT(B${n},"0.0")&" cmol(+)/kg, Ca:Mg "&ROUND(D${n},1)&", spread "&TEXT(H${n},"0.00")&" t/ha of "&${L("K")}`);
    calc[`K${n}`] = F(`H${n}*INDEX(Products,MATCH(${L("K")},INDEX(Products,0,1),0),4)`);
    calc[`L${n}`] = F(`${L("C")}+IF(H${n}>2.5,365,730)`, 1);
    calc[`M${n}`] = S(`SOIL.SATURATION("K",${L("F")},${L("G")},${L("H")},${L("I")},"mg/kg",${L("J")},B${n})`, 2);
    calc[`N${n}`] = F(`IFS(D${n}<2,"Mg high",D${n}>8,"Mg low",TRUE,"-")`.replace("IFS(", "_xlfn.IFS("));
  }
  const products = {
    A1: "Product", B1: "CCE %", C1: "Fineness %", D1: "$/t spread",
    A2: "Calcitic fine", B2: 98, C2: 95, D2: 62,
    A3: "Calcitic coarse", B3: 96, C3: 70, D3: 48,
    A4: "Dolomitic", B4: 104, C4: 88, D4: 71,
  };
  const summary = {
    A1: "Farm", B1: "Lime t (sum t/ha)", C1: "Paddocks to lime", D1: "Mean CEC", E1: "Mean CEC, Ca sat > 60", F1: "Max lime", G1: "Min CEC", H1: "Cost",
    A2: "Ardlow", A3: "Merrin Vale",
    I1: "Lowest K sat", J1: "All lines",
  };
  for (const n of [2, 3]) {
    summary[`B${n}`] = F(`SUMIF('Lab A'!$B:$B,$A${n},Calc!$H:$H)`);
    summary[`C${n}`] = F(`COUNTIFS('Lab A'!$B$2:$B$9,$A${n},Calc!$G$2:$G$9,"Apply*")`);
    summary[`D${n}`] = F(`AVERAGEIF('Lab A'!$B$2:$B$9,$A${n},Calc!$B$2:$B$9)`);
    summary[`E${n}`] = F(`IFERROR(AVERAGEIFS(Calc!$B$2:$B$9,'Lab A'!$B$2:$B$9,$A${n},Calc!$C$2:$C$9,">60"),"none")`);
    summary[`F${n}`] = F(`_xlfn.MAXIFS(Calc!$F$2:$F$9,'Lab A'!$B$2:$B$9,$A${n})`);
    summary[`G${n}`] = F(`_xlfn.MINIFS(Calc!$B$2:$B$9,'Lab A'!$B$2:$B$9,$A${n})`);
    summary[`H${n}`] = F(`SUMPRODUCT(('Lab A'!$B$2:$B$9=$A${n})*Calc!$K$2:$K$9)`);
  }
  summary.I2 = F(`MIN(Calc!M2:M9)`);
  summary.J2 = DA(`_xlfn.TEXTJOIN("; ",TRUE,Calc!J2:J9)`);
  summary.A5 = "Total lime (t/ha summed)";
  summary.B5 = F(`SUM(B2:B3)`);
  summary.A6 = "Max CEC";
  summary.B6 = F(`MAX(Calc!B:B)`);
  summary.A7 = "Paddocks with Ca:Mg over 5";
  summary.B7 = F(`COUNTIF(Calc!D2:D9,">5")`);
  summary.A8 = "Largest spread";
  summary.B8 = F(`INDEX(Calc!A2:A9,MATCH(MAX(Calc!H2:H9),Calc!H2:H9,0))`);
  const settings = { A1: "Target pH", B1: 6.2 };
  return finish({
    sheets: [
      { name: "Lab A", cells: lab },
      { name: "Calc", cells: calc },
      { name: "Products", cells: products },
      { name: "Summary", cells: summary },
      { name: "Settings", cells: settings },
    ],
    names: [
      { name: "Products", value: "Products!$A$2:$D$4" },
      { name: "TargetPH", value: "Settings!$B$1" },
    ],
  });
}

// ---------------------------------------------------------------- 2. Kilbrennan: spilled SOIL columns, B2# downstream
function kilbrennan() {
  const cells = {
    A1: "Paddock", B1: "Ca meq/100g", C1: "Mg", D1: "K", E1: "Na", F1: "H+Al", G1: "CEC (spill)", H1: "rounded", I1: "Base sat (spill)", J1: "lime t/ha (spill)", K1: "rounded up",
  };
  const data = [
    ["K1", 6.2, 1.8, 0.42, 0.15, 1.2],
    ["K2", 9.8, 2.4, 0.55, 0.2, 0.4],
    ["K3", 3.1, 0.9, 0.21, 0.1, 2.6],
    ["K4", 12.5, 3.3, 0.8, 0.35, 0.1],
    ["K5", 4.4, 1.2, 0.3, 0.12, 1.9],
    ["K6", 7.7, 2.0, 0.61, 0.18, 0.9],
    ["K7", 5.5, 1.5, 0.35, 0.14, 1.4],
    ["K8", 15.2, 4.1, 0.95, 0.4, 0.05],
  ];
  data.forEach((r, i) => r.forEach((v, j) => (cells[`${"ABCDEF"[j]}${i + 2}`] = v)));
  cells.G2 = S(`SOIL.CEC(B2:B9,C2:C9,D2:D9,E2:E9,"meq/100g",F2:F9)`, 10, "G2:G9");
  cells.I2 = S(`SOIL.SATURATION("bases",B2:B9,C2:C9,D2:D9,E2:E9,"cmol(+)/kg",F2:F9)`, 70, "I2:I9");
  cells.J2 = S(`SOIL.LIMEBASESAT(_xlfn.ANCHORARRAY(G2),_xlfn.ANCHORARRAY(I2),70,20,1.3,"t/ha")`, 1, "J2:J9");
  for (const r of range(3, 9)) {
    cells[`G${r}`] = 10;
    cells[`I${r}`] = 70;
    cells[`J${r}`] = 1;
  }
  fill(cells, "H", range(2, 9), (r) => (r === 2 ? { f: "ROUND(G2,1)", t: "shared", ref: "H2:H9", si: 0 } : { f: "", t: "shared", si: 0 }));
  fill(cells, "K", range(2, 9), (r) => (r === 2 ? { f: "ROUNDUP(J2*2,0)/2", t: "shared", ref: "K2:K9", si: 1 } : { f: "", t: "shared", si: 1 }));
  Object.assign(cells, {
    M1: "Season", M2: "Sum CEC", N2: F("SUM(_xlfn.ANCHORARRAY(G2))"),
    M3: "Mean CEC", N3: F("AVERAGE(_xlfn.ANCHORARRAY(G2))"),
    M4: "CEC >= 15", N4: F('COUNTIF(_xlfn.ANCHORARRAY(G2),">=15")'),
    M5: "3rd CEC", N5: F("INDEX(_xlfn.ANCHORARRAY(G2),3)"),
    M6: "CEC spread", N6: F("MAX(_xlfn.ANCHORARRAY(G2))-MIN(G2:G9)"),
    M7: "Base sat < 70", N7: F("SUMPRODUCT((_xlfn.ANCHORARRAY(I2)<70)*1)"),
    M8: "Low-CEC paddocks", N8: DA('_xlfn.TEXTJOIN(", ",TRUE,IF(_xlfn.ANCHORARRAY(G2)<10,A2:A9,""))'),
    M9: "Lime total t/ha", N9: F("SUM(K2:K9)"),
    M10: "Heaviest", N10: F("INDEX(A2:A9,MATCH(MAX(_xlfn.ANCHORARRAY(J2)),_xlfn.ANCHORARRAY(J2),0))"),
    M11: "Rows", N11: F("ROWS(_xlfn.ANCHORARRAY(G2))"),
    M12: "Large 2", N12: F("LARGE(_xlfn.ANCHORARRAY(J2),2)"),
    M13: "Median bs", N13: F("MEDIAN(_xlfn.ANCHORARRAY(I2))"),
    M14: "Stdev CEC", N14: F("_xlfn.STDEV.S(G2:G9)"),
    M15: "weighted bs", N15: F("SUMPRODUCT(_xlfn.ANCHORARRAY(G2),_xlfn.ANCHORARRAY(I2))/SUM(_xlfn.ANCHORARRAY(G2))"),
    M16: "Lime by 1.1", N16: DA("ROUND(_xlfn.ANCHORARRAY(J2)*1.1,2)", "N16:N23"),
  });
  return finish({ sheets: [{ name: "Season 2025", cells }] });
}

// ---------------------------------------------------------------- 3. Tarrawong: 1904 date system, retest dates, split applications
function tarrawong(d1904 = true) {
  const cells = { A1: "Paddock", B1: "Sampled", C1: "Buffer pH", D1: "Soil pH", E1: "Lime ton/ac", F1: "Years to split", G1: "Retest", H1: "Retest text", I1: "Last application", J1: "Days", K1: "Month", L1: "Weekday", M1: "Note" };
  const rows = [
    ["North", [2024, 2, 29], 5.9, 5.3],
    ["South", [2025, 1, 31], 5.2, 4.9],
    ["Dam", [2025, 12, 30], 6.4, 5.9],
    ["Gully", [2025, 7, 15], 5.0, 4.8],
    ["Orchard", [2026, 2, 28], 6.8, 6.5],
  ];
  rows.forEach((r, i) => {
    const n = i + 2;
    cells[`A${n}`] = r[0];
    cells[`B${n}`] = date(...r[1], d1904);
    cells[`C${n}`] = r[2];
    cells[`D${n}`] = r[3];
    cells[`E${n}`] = S(`SOIL.LIMEBUFFER(C${n},6.5,"SIKORA-OR2025",D${n},,"ton/ac")`, 0.5);
    cells[`F${n}`] = F(`MAX(1,ROUNDUP(E${n}/2.5,0))`);
    cells[`G${n}`] = F(`DATE(YEAR(B${n})+F${n},MONTH(B${n}),DAY(B${n}))`, 1);
    cells[`H${n}`] = F(`"Retest "&A${n}&" by "&TEXT(G${n},"d mmm yyyy")&" ("&TEXT(G${n},"dddd")&")"`);
    cells[`I${n}`] = F(`EDATE(B${n},12*(F${n}-1))`, 1);
    cells[`J${n}`] = F(`G${n}-B${n}`);
    cells[`K${n}`] = F(`EOMONTH(B${n}+E${n}*100,0)`, 1);
    cells[`L${n}`] = F(`WEEKDAY(B${n}+ROUND(E${n}*30,0),2)`);
    cells[`M${n}`] = F(`IF(E${n}=0,"no lime","split over "&F${n}&" year"&IF(F${n}>1,"s","")&", first by "&TEXT(B${n}+60,"dd/mm/yy"))`);
  });
  cells.A8 = "Earliest retest";
  cells.B8 = F("MIN(G2:G6)", 1);
  cells.A9 = "Latest retest";
  cells.B9 = F("TEXT(MAX(G2:G6),\"yyyy-mm-dd\")");
  cells.A10 = "Days span";
  cells.B10 = F(`_xlfn.DAYS(MAX(G2:G6),MIN(G2:G6))`);
  cells.A11 = "DATEDIF";
  cells.B11 = F(`DATEDIF(B2,G2,"m")&" months"`);
  cells.A12 = "Year of sum";
  cells.B12 = F(`YEAR(SUM(E2:E6)+B3)`);
  return finish({ sheets: [{ name: "Lime plan", cells }], date1904: d1904 });
}

// ---------------------------------------------------------------- 4. Boolcarra: text lab data, blanks, LABVALUE feeding natives
function boolcarra() {
  const cells = { A1: "Paddock", B1: "Olsen P mg/kg (lab)", C1: "P read", D1: "P kg/ha 0-10", E1: "doubled", F1: "blank?", G1: "status", H1: "K mg/kg", I1: "K read", J1: "K cmol", K1: "sum" };
  const raw = [12, "<5", "n.d.", null, ">300", "1 250", " 18 ", "7.5", "trace", 0];
  const kraw = [150, "<20", 210, "n.a.", 95, 120, null, "180", 60, 75];
  raw.forEach((v, i) => {
    const n = i + 2;
    cells[`A${n}`] = `B${i + 1}`;
    if (v === null) cells[`B${n}`] = null;
    else cells[`B${n}`] = v;
    if (kraw[i] === null) cells[`H${n}`] = null;
    else cells[`H${n}`] = kraw[i];
    cells[`C${n}`] = S(`SOIL.LABVALUE(B${n},"half","limit")`, 3);
    cells[`D${n}`] = S(`SOIL.CONVERT(C${n},"mg/kg","kg/ha",10,1.2)`, 3);
    cells[`E${n}`] = F(`IF(ISNUMBER(C${n}),C${n}*2,"missing")`);
    cells[`F${n}`] = F(`IF(C${n}="","no result",IF(ISBLANK(C${n}),"blank","value"))`);
    cells[`G${n}`] = F(`IFERROR(IF(D${n}<20,"low","ok"),"check")`);
    cells[`I${n}`] = S(`SOIL.LABVALUE(H${n},"zero")`, 3);
    cells[`J${n}`] = S(`SOIL.CMOL(I${n},"K")`, 3);
    cells[`K${n}`] = F(`C${n}+I${n}`);
  });
  Object.assign(cells, {
    M1: "count P", N1: F("COUNT(C2:C11)"),
    M2: "mean P", N2: F("AVERAGE(C2:C11)"),
    M3: "blank P", N3: F("COUNTBLANK(C2:C11)"),
    M4: "counta P", N4: F("COUNTA(C2:C11)"),
    M5: "sum kg/ha", N5: F("SUM(D2:D11)"),
    M6: "low count", N6: F('COUNTIF(G2:G11,"low")'),
    M7: "errors", N7: F("SUMPRODUCT(--ISERROR(J2:J11))"),
    M8: "max K cmol", N8: F("MAX(J2:J11)"),
    M9: "first missing", N9: F('INDEX(A2:A11,MATCH("missing",E2:E11,0))'),
    M10: "mean K if >0", N10: F('AVERAGEIF(I2:I11,">0")'),
    M11: "blank as 0", N11: F("C5*1"),
    M12: "blank text", N12: F('C5&"|"'),
    M13: "min P", N13: F("MIN(C2:C11)"),
    M14: "iferror K", N14: F('IFERROR(J5,"n/a")'),
    M15: "n of text", N15: F("N(C5)"),
    M16: "len", N16: F("LEN(C5)"),
  });
  return finish({ sheets: [{ name: "Lab B", cells }] });
}

// ---------------------------------------------------------------- 5. Corrabee: defined names, INDIRECT, OFFSET, quoted sheet names, name holding a formula
function corrabee() {
  const lab = { A1: "Paddock", B1: "Ca cmol(+)/kg", C1: "Mg", D1: "K", E1: "Na", F1: "Al", G1: "pH" };
  const data = [
    ["Hill", 4.2, 1.1, 0.3, 0.1, 0.9, 4.9],
    ["Flat", 8.8, 2.2, 0.6, 0.2, 0.1, 5.8],
    ["Spring", 2.9, 0.8, 0.2, 0.1, 1.5, 4.6],
    ["Yard", 11.4, 2.9, 0.9, 0.3, 0, 6.3],
    ["Lane", 6.1, 1.6, 0.4, 0.1, 0.5, 5.2],
    ["Far", 5.0, 1.4, 0.3, 0.15, 0.7, 5.0],
  ];
  data.forEach((r, i) => r.forEach((v, j) => (lab[`${"ABCDEFG"[j]}${i + 2}`] = v)));
  const calc = { A1: "Paddock", B1: "ECEC", C1: "Al sat", D1: "Lime (Al) t/ha", E1: "via INDIRECT", F1: "via OFFSET", G1: "vs target" };
  for (const n of range(2, 7)) {
    const L = (c) => `'Lab (Feb)'!${c}${n}`;
    calc[`A${n}`] = F(L("A"));
    calc[`B${n}`] = S(`SOIL.CEC(${L("B")},${L("C")},${L("D")},${L("E")},"cmol(+)/kg",${L("F")})`, 2);
    calc[`C${n}`] = S(`SOIL.SATURATION("acidity",${L("B")},${L("C")},${L("D")},${L("E")},"cmol(+)/kg",${L("F")})`, 5);
    calc[`D${n}`] = S(`SOIL.LIMEALSAT(${L("F")},${L("B")},${L("C")},AlTarget,,20,1.25,"t/ha")`, 1);
    calc[`E${n}`] = F(`INDIRECT("'Calc sheet'!B"&ROW())*1`);
    calc[`F${n}`] = F(`OFFSET('Calc sheet'!$D$1,ROW()-1,0)`);
    calc[`G${n}`] = F(`IF(C${n}>AlTarget,"over by "&ROUND(C${n}-AlTarget,1),"within")`);
  }
  const rep = {
    A1: "Mean ECEC", B1: F("AVERAGE(ECEC)"),
    A2: "Lime total", B2: F("LimeTotal"),
    A3: "Lime total x area", B3: F("LimeTotal*Area"),
    A4: "4th via OFFSET", B4: F("SUM(OFFSET('Calc sheet'!$B$1,1,0,6,1))"),
    A5: "via INDIRECT range", B5: F(`SUM(INDIRECT("'Calc sheet'!D2:D7"))`),
    A6: "local name", B6: F("Local_CEC"),
    A7: "count over target", B7: F(`COUNTIF('Calc sheet'!C2:C7,">"&AlTarget)`),
    A8: "ROW of max", B8: F("MATCH(MAX(ECEC),ECEC,0)"),
    A9: "via INDEX name", B9: F("INDEX(ECEC,2)*2"),
    A10: "Intersect name", B10: F("SUM(ECEC Lime_col)"),
    A11: "hlookup", B11: F(`HLOOKUP("Lime (Al) t/ha",'Calc sheet'!A1:G7,3,FALSE)`),
    A12: "choose", B12: F(`CHOOSE(2,'Calc sheet'!B2,'Calc sheet'!B3,'Calc sheet'!B4)`),
    C1: "Settings", C2: "Al target %", D2: 15, C3: "Area ha", D3: 42.5,
  };
  return finish({
    sheets: [
      { name: "Lab (Feb)", cells: lab },
      { name: "Calc sheet", cells: calc },
      { name: "Report", cells: rep },
    ],
    names: [
      { name: "ECEC", value: "'Calc sheet'!$B$2:$B$7" },
      { name: "Lime_col", value: "'Calc sheet'!$B$4:$D$4" },
      { name: "AlTarget", value: "Report!$D$2" },
      { name: "Area", value: "Report!$D$3" },
      { name: "LimeTotal", value: "SUM('Calc sheet'!$D$2:$D$7)" },
      { name: "Local_CEC", value: "'Calc sheet'!$B$3", sheet: "Report" },
    ],
  });
}

// ---------------------------------------------------------------- 6. Ninemile: sufficiency and bands as text, downstream counting and rates
function ninemile() {
  const cells = { A1: "Paddock", B1: "Bray-1 P mg/kg", C1: "P band", D1: "own band", E1: "P2O5 kg/ha", F1: "switch", G1: "pos", H1: "bar", I1: "rank", J1: "upper", K1: "M3 K mg/kg", L1: "CEC", M1: "K band", N1: "line" };
  const P = [4, 9, 15, 22, 31, 45, 12, 26];
  const K = [60, 95, 130, 180, 210, 300, 110, 150];
  const CEC = [6, 8, 12, 14, 18, 25, 10, 9];
  P.forEach((p, i) => {
    const n = i + 2;
    cells[`A${n}`] = `N${i + 1}`;
    cells[`B${n}`] = p;
    cells[`K${n}`] = K[i];
    cells[`L${n}`] = CEC[i];
    cells[`C${n}`] = S(`SOIL.SUFFICIENCY("P",B${n},"corn-soybean","Bray-1")`, "stale");
    cells[`D${n}`] = S(`SOIL.BAND(B${n},$Q$2:$Q$5)`, "stale");
    cells[`E${n}`] = F(`_xlfn.IFS(D${n}="Very low",90,D${n}="Low",60,D${n}="Optimum",30,TRUE,0)`);
    cells[`F${n}`] = F(`_xlfn.SWITCH(LEFT(D${n},4),"Very","build","Low","build","Opti","maintain","none")`);
    cells[`G${n}`] = S(`SOIL.BANDPOS(B${n},$Q$2:$Q$5)`, 0);
    cells[`H${n}`] = F(`REPT("#",ROUND(MIN(MAX(G${n},0),4)*5,0))`);
    cells[`I${n}`] = F(`MATCH(D${n},{"Very low","Low","Optimum","High","Very high"},0)`);
    cells[`J${n}`] = F(`UPPER(C${n})&" / "&LEN(D${n})`);
    cells[`M${n}`] = S(`SOIL.SUFFICIENCY("K",K${n},"corn","Mehlich-3",L${n})`, "stale");
    cells[`N${n}`] = F(`_xlfn.CONCAT(A${n},": P ",D${n},", K ",M${n})`);
  });
  Object.assign(cells, {
    Q1: "P limits", Q2: 5, Q3: 10, Q4: 20, Q5: 30,
    S1: "low-ish", T1: F('COUNTIF(D2:D9,"*low")'),
    S2: "optimum", T2: F('COUNTIF(D2:D9,"Optimum")'),
    S3: "P2O5 total", T3: F("SUM(E2:E9)"),
    S4: "paddocks to build", T4: DA('_xlfn.TEXTJOIN(", ",TRUE,IF(F2:F9="build",A2:A9,""))'),
    S5: "mean rank", T5: F("AVERAGE(I2:I9)"),
    S6: "exact", T6: F('EXACT(D2,"Very low")'),
    S7: "K below", T7: F('COUNTIF(M2:M9,"Below*")+COUNTIF(M2:M9,"Very*")'),
    S8: "K bands", T8: DA('_xlfn.TEXTJOIN("|",FALSE,M2:M9)'),
    S9: "find", T9: F('IFERROR(FIND("ptim",C2),0)'),
    S10: "sumif rate low", T10: F('SUMIF(D2:D9,"Low",E2:E9)'),
    S11: "subst", T11: F('SUBSTITUTE(D3," ","_")'),
    S12: "first opt", T12: F('VLOOKUP("Optimum",CHOOSE({1,2},D2:D9,A2:A9),2,FALSE)'),
    S13: "first opt (DA)", T13: DA('VLOOKUP("Optimum",CHOOSE({1,2},D2:D9,A2:A9),2,FALSE)'),
    S15: "legacy choose", T15: F('CHOOSE({1,2},D2:D9,A2:A9)'),
    S16: "legacy choose sum", T16: F('SUM(CHOOSE({1,2},E2:E9,E2:E9))'),
    S17: "legacy index choose", T17: F('INDEX(CHOOSE({1,2},E2:E9,A2:A9),4,2)'),
    S18: "legacy match choose", T18: F('MATCH("N4",INDEX(CHOOSE({1,2},E2:E9,A2:A9),0,2),0)'),
    S14: "left lookup rate", T14: DA('INDEX(CHOOSE({1,2},E2:E9,A2:A9),MATCH("N5",A2:A9,0),1)'),
  });
  return finish({ sheets: [{ name: "Bands", cells }] });
}

// ---------------------------------------------------------------- 7. Wirrega: shared fills, mixed absolute refs, SOIL inside natives, chain SOIL→native→SOIL
function wirrega() {
  const cells = { A1: "Paddock", B1: "Ca mg/kg", C1: "Mg mg/kg", D1: "K mg/kg", E1: "Na mg/kg", F1: "CEC", G1: "x area", H1: "$ col", I1: "ratio", J1: "chain", K1: "chain SOIL", L1: "mixed", M1: "target", N1: "rowsum" };
  const data = [
    ["W1", 1200, 200, 150, 40],
    ["W2", 900, 150, 120, 30],
    ["W3", 2100, 380, 260, 70],
    ["W4", 600, 90, 80, 20],
    ["W5", 1500, 250, 200, 50],
    ["W6", 1750, 300, 90, 65],
  ];
  data.forEach((r, i) => r.forEach((v, j) => (cells[`${"ABCDE"[j]}${i + 2}`] = v)));
  cells.P1 = "area";
  cells.Q1 = 12.5;
  cells.P2 = "factor";
  cells.Q2 = 1.05;
  for (const n of range(2, 7)) {
    cells[`F${n}`] = S(`SOIL.CEC(B${n},C${n},D${n},E${n},"ppm")`, 3);
    cells[`G${n}`] = n === 2 ? { f: "F2*$Q$1", t: "shared", ref: "G2:G7", si: 0 } : { f: "", t: "shared", si: 0 };
    cells[`H${n}`] = n === 2 ? { f: "$F2*Q$2", t: "shared", ref: "H2:H7", si: 1 } : { f: "", t: "shared", si: 1 };
    cells[`I${n}`] = n === 2 ? { f: "F2/F$2", t: "shared", ref: "I2:I7", si: 2 } : { f: "", t: "shared", si: 2 };
    cells[`J${n}`] = F(`F${n}*100-B${n}/10`);
    cells[`K${n}`] = S(`SOIL.MGKG(J${n}/100,"Ca")`, 1);
    cells[`L${n}`] = F(`ROUND(K${n},-1)+ROUND(_xldudf_SOIL_CMOL(B${n},"Ca"),2)`);
    cells[`M${n}`] = F(`IF(AND(F${n}>8,OR(I${n}>1,K${n}>1000)),"A",IF(NOT(F${n}>5),"C","B"))`);
    cells[`N${n}`] = F(`SUM(F${n}:K${n})`);
  }
  Object.assign(cells, {
    A9: "col F total", F9: F("SUM(F2:F7)"), G9: F("SUM(G2:G7)"), H9: F("SUMPRODUCT(H2:H7,I2:I7)"),
    A10: "ROUND half", F10: F("ROUND(F2,1)&\"|\"&ROUNDDOWN(F3,1)&\"|\"&TRUNC(F4*10)/10&\"|\"&INT(-F5)"),
    A11: "MOD/POWER", F11: F("MOD(F2*100,7)+POWER(F3,0.5)-SQRT(F3)"),
    A12: "count A", F12: F('COUNTIF(M2:M7,"A")'),
    A13: "text fmt", F13: F('TEXT(F2,"0.00")&" "&TEXT(F3/100,"0.0%")&" "&TEXT(F4*1000,"#,##0")'),
    A14: "VALUE back", F14: F('VALUE(TEXT(F2,"0.000"))*2'),
    A15: "F of row 4", F15: F("INDEX(F2:F7,3)+INDEX($F$2:$N$7,3,6)"),
  });
  return finish({ sheets: [{ name: "Wirrega", cells }] });
}

// ---------------------------------------------------------------- 8. Glenroy: errors from SOIL, empty arguments, IFERROR/ISERR decisions
function glenroy() {
  const cells = { A1: "Paddock", B1: "Ca", C1: "Mg", D1: "unit", E1: "Ca:Mg", F1: "decision", G1: "iserror", H1: "times 2", I1: "ifna", J1: "buffer", K1: "lime", L1: "rounded" };
  const rows = [
    ["G1", 1200, 180, "mg/kg", 5.9],
    ["G2", 6.5, 1.9, "cmol/kg", 6.2],
    ["G3", 8.1, 2.5, "meq/100g", 7.5],
    ["G4", 900, 0, "mg/kg", 5.5],
    ["G5", "", 150, "mg/kg", 4.5],
    ["G6", 1100, 210, "ppm", 6.0],
  ];
  rows.forEach((r, i) => {
    const n = i + 2;
    cells[`A${n}`] = r[0];
    cells[`B${n}`] = r[1] === "" ? { inline: "" } : r[1];
    cells[`C${n}`] = r[2];
    cells[`D${n}`] = r[3];
    cells[`J${n}`] = r[4];
    cells[`E${n}`] = S(`SOIL.CAMG(B${n},C${n},D${n})`, 4);
    cells[`F${n}`] = F(`IFERROR(IF(E${n}>7,"Mg low","Mg ok"),"check lab unit")`);
    cells[`G${n}`] = F(`ISERROR(E${n})`);
    cells[`H${n}`] = F(`E${n}*2`);
    cells[`I${n}`] = F(`_xlfn.IFNA(E${n},"no data")`);
    cells[`K${n}`] = S(`SOIL.LIMEBUFFER(J${n},6.5,"SIKORA-OR2025",,,"ton/ac")`, 1);
    cells[`L${n}`] = F(`ROUND(K${n},)&"|"&IF(K${n}>1,,"small")&"|"&MAX(K${n},)`);
  });
  Object.assign(cells, {
    N1: "sum lime", O1: F("SUM(K2:K7)"),
    N2: "sum iferror", O2: DA("SUM(IFERROR(K2:K7,0))"),
    N3: "count ok", O3: F("COUNT(E2:E7)"),
    N4: "error type", O4: F("ERROR.TYPE(E3)"),
    N5: "aggregate ok", O5: F('SUMIF(K2:K7,">0")'),
    N6: "vlookup empty", O6: F("VLOOKUP(\"G3\",A2:K7,11,)"),
    N7: "iserr", O7: F("ISERR(K7)"),
    N8: "max", O8: F("MAX(K2:K7)"),
    N9: "empty concat", O9: F('CONCATENATE(A2,,"-",E2)'),
    N10: "avg iferror", O10: DA('AVERAGE(IF(ISNUMBER(E2:E7),E2:E7))'),
    N11: "counta", O11: F("COUNTA(E2:E7)"),
    N12: "text of err", O12: F('IF(ISERROR(E3),"refused: see cell","ok")'),
  });
  return finish({ sheets: [{ name: "Glenroy", cells }] });
}

// ---------------------------------------------------------------- 9. Mount Ossa: oxides, removal, N fixation budget, ESP/SAR
function ossa() {
  const cells = { A1: "Paddock", B1: "crop", C1: "yield t/ha", D1: "P2O5 removed kg/ha", E1: "as P", F1: "applied P", G1: "balance", H1: "status", I1: "shoot DM t/ha", J1: "shoot N %", K1: "Ndfa %", L1: "fixed N", M1: "grain N %", N1: "N balance", O1: "note" };
  const rows = [
    ["O1", "wheat", 4.2, 12, 3.5, 1.9, 70, 3.8],
    ["O2", "barley", 3.6, 8, 4.1, 2.2, 62, 3.5],
    ["O3", "canola", 1.8, 15, 5.0, 2.8, 81, 3.9],
    ["O4", "oats", 2.9, 0, 2.2, 2.4, 45, 3.2],
  ];
  rows.forEach((r, i) => {
    const n = i + 2;
    ["A", "B", "C"].forEach((c, j) => (cells[`${c}${n}`] = r[j]));
    cells[`F${n}`] = r[3];
    cells[`I${n}`] = r[4];
    cells[`J${n}`] = r[5];
    cells[`K${n}`] = r[6];
    cells[`M${n}`] = r[7];
    cells[`D${n}`] = S(`SOIL.REMOVAL(B${n},C${n},"P2O5","t/ha")`, 10);
    cells[`E${n}`] = S(`SOIL.OXIDE(D${n},"P2O5","P")`, 4);
    cells[`G${n}`] = F(`F${n}-E${n}`);
    cells[`H${n}`] = F(`IF(G${n}<0,"deficit "&TEXT(-G${n},"0.0")&" kg P/ha","surplus")`);
    cells[`L${n}`] = S(`SOIL.NFIXED(I${n},J${n},K${n},"shoot")`, 50);
    cells[`N${n}`] = S(`SOIL.NBALANCE(L${n},C${n},M${n})`, 0);
    cells[`O${n}`] = F(`IF(N${n}<0,"N mined: "&ROUND(N${n},0),"N added: +"&ROUND(N${n},0))&" kg/ha"`);
  });
  Object.assign(cells, {
    A8: "Na meq/100g", B8: 1.4, C8: "CEC", D8: 11.2, E8: "ESP", F8: S('SOIL.ESP(B8,D8,"meq/100g")', 3),
    G8: F('IF(F8>=6,"sodic","non-sodic")&" ("&FIXED_TXT&")"'.replace("FIXED_TXT", 'TEXT(F8,"0.0")&"%"')),
    A9: "SAR in", B9: 2.1, C9: 3.4, D9: 1.1, E9: "SAR", F9: S('SOIL.SAR(B9,C9,D9,"meq/L")', 1), G9: F("ROUND(F9,2)*10"),
    A10: "total deficit", B10: F('SUMIF(G2:G5,"<0")'),
    A11: "crops in deficit", B11: DA('_xlfn.TEXTJOIN(",",TRUE,IF(G2:G5<0,B2:B5,""))'),
    A12: "P removal wheat+barley", B12: F('SUMIFS(D2:D5,B2:B5,"wheat")+SUMIFS(D2:D5,B2:B5,"barley")'),
    A13: "kg P2O5 total rounded", B13: F("ROUND(SUM(D2:D5),0)"),
    A14: "lb/ac of that", B14: S('SOIL.CONVERT(B13,"kg/ha","lb/ac")', 1),
    A15: "lb rounded", B15: F("ROUND(B14,1)"),
    A16: "ESP sar est", B16: S("SOIL.ESPSAR(F9)", 1), C16: F("IF(B16<0,0,B16)"),
  });
  return finish({ sheets: [{ name: "Budget", cells }] });
}


// ---------------------------------------------------------------- 11. Pindari: spill sizes that changed, shared fills over mixed rows, 3D refs, legacy arrays, newer functions, numbers as text
function pindari() {
  const cells = { A1: "Paddock", B1: "Ca cmol", C1: "Mg", D1: "K", E1: "Na", G1: "CEC grew", H1: "CEC shrank", J1: "fill", K1: "legacy array", L1: "intersect", M1: "as text" };
  const data = [
    [5.1, 1.2, 0.3, 0.1], [6.2, 1.5, 0.4, 0.2], [7.3, 1.9, 0.5, 0.1], [3.3, 0.9, 0.2, 0.1], [9.9, 2.4, 0.7, 0.3],
    [4.4, 1.1, 0.3, 0.1], [8.8, 2.2, 0.6, 0.2], [2.2, 0.5, 0.1, 0.05], [11.1, 3.0, 0.9, 0.4], [6.6, 1.7, 0.4, 0.2],
  ];
  data.forEach((r, i) => {
    cells[`A${i + 2}`] = `P${i + 1}`;
    r.forEach((v, j) => (cells[`${"BCDE"[j]}${i + 2}`] = v));
  });
  // saved when the season had 6 rows; now 10
  cells.G2 = S('SOIL.CEC(B2:B11,C2:C11,D2:D11,E2:E11,"cmol(+)/kg")', 1, "G2:G7");
  for (const r of range(3, 7)) cells[`G${r}`] = 1;
  // saved with 8 rows; now 3
  cells.H2 = S('SOIL.CEC(B2:B4,C2:C4,D2:D4,E2:E4,"cmol(+)/kg")', 2, "H2:H9");
  for (const r of range(3, 9)) cells[`H${r}`] = 2;
  // a shared fill whose rows alternate between a SOIL cell and a constant in column F
  for (const r of range(2, 11)) cells[`F${r}`] = r % 2 ? S(`SOIL.CMOL(${Math.round(data[r - 2][0] * 200.39)},"Ca")`, 0) : data[r - 2][0];
  for (const r of range(2, 11)) cells[`J${r}`] = r === 2 ? { f: "F2*2+$Q$1", t: "shared", ref: "J2:J11", si: 0 } : { f: "", t: "shared", si: 0 };
  // a legacy (Ctrl+Shift+Enter) array over the grown spill
  cells.K2 = { f: "G2:G11*10", t: "array", ref: "K2:K11" };
  for (const r of range(3, 11)) cells[`K${r}`] = 0;
  for (const r of range(2, 11)) cells[`L${r}`] = F("$G$2:$G$11+0");
  for (const r of range(2, 6)) cells[`M${r}`] = F(`G${r}&""`);
  cells.Q1 = 0.5;
  Object.assign(cells, {
    S1: "sum grown", T1: F("SUM(G2:G11)"),
    S2: "count grown", T2: F("COUNT(G2:G11)"),
    S3: "sum shrunk", T3: F("SUM(H2:H9)"),
    S4: "count shrunk", T4: F("COUNT(H2:H9)"),
    S5: "blank shrunk", T5: F("COUNTBLANK(H2:H9)"),
    S6: "3D sum", T6: F("SUM(Pindari:Other!B2)"),
    S7: "spill rows", T7: F("ROWS(_xlfn.ANCHORARRAY(G2))"),
    S8: "spill shrunk rows", T8: F("ROWS(_xlfn.ANCHORARRAY(H2))"),
    S9: "xlookup", T9: F('_xlfn.XLOOKUP("P3",A2:A11,G2:G11)'),
    S10: "single", T10: F("_xlfn.SINGLE(G2:G11)"),
    S11: "pct", T11: F("G2%"),
    S12: "precise text", T12: F('"v="&G3/3'),
    S13: "tiny text", T13: F('""&G3/300000000'),
    S14: "big text", T14: F('""&G3*123456789012'),
    S15: "eq", T15: F("G2=SUM(B2:E2)"),
    S16: "name spill", T16: F("SUM(GrownCEC)"),
    S17: "bool sum", T17: F("SUMPRODUCT(--(G2:G11>8))"),
    S18: "circ", T18: F("T19+1"),
    S19: "circ soil", T19: S('SOIL.CMOL(T18,"Ca")', 0),
    S20: "H shrunk+1", T20: F("H5+1"),
    S21: "filter", T21: DA("_xlfn._xlws.FILTER(A2:A11,G2:G11>8)", "T21:T24"),
    S26: "let", T26: F("_xlfn.LET(_xlpm.x,G2,_xlpm.x*2)"),
    S27: "round half", T27: F("ROUND(G4*1000,0)/1000"),
    S28: "mround", T28: F("MROUND(G2,0.5)"),
  });
  const other = { B2: 100 };
  const mid = { B2: 7 };
  return finish({
    sheets: [
      { name: "Pindari", cells },
      { name: "Mid", cells: mid },
      { name: "Other", cells: other },
    ],
    names: [{ name: "GrownCEC", value: "_xlfn.ANCHORARRAY(Pindari!$G$2)" }],
  });
}

const BOOKS = [
  { name: "ardlow-downs-2025", book: ardlow() },
  { name: "kilbrennan-spills", book: kilbrennan() },
  { name: "tarrawong-1904", book: tarrawong(true) },
  { name: "tarrawong-1900", book: tarrawong(false) },
  { name: "boolcarra-lab-text", book: boolcarra() },
  { name: "corrabee-names", book: corrabee() },
  { name: "ninemile-bands", book: ninemile() },
  { name: "wirrega-fills", book: wirrega() },
  { name: "glenroy-errors", book: glenroy() },
  { name: "mount-ossa-budget", book: ossa() },
  { name: "pindari-edges", book: pindari() },
];

module.exports = { BOOKS, S, F, DA, date };
