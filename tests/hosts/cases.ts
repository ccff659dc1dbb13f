/**
 * One table of SOIL calls checked in every host we can run: the headless engine (a formula typed
 * as a user would, through evaluateFormula) and the built add-in bundle in Chromium (the same
 * call made as Excel's runtime makes it: every argument a matrix, an omitted one null). Both must
 * give the expected value, and the browser must give exactly what the engine gives.
 *
 * Each case names its Source (as in tests/core and tests/engine); argument values that are only
 * there to exercise shapes, blanks and errors are invented.
 */

/** One cell of an argument: a number, a text, or null for a blank cell. */
export type CaseCell = number | string | null;
/** An argument: a single value, a range (rows of cells), or undefined for an omitted argument. */
export type CaseArg = CaseCell | CaseCell[][] | undefined;

export interface ExpectedError {
  readonly error: "#VALUE!" | "#N/A";
  /** The whole message, or a pattern it must match. */
  readonly message: string | RegExp;
}
/** An expected element: a number (to `digits` decimals), a text or a pattern, "" for blank, an error. */
export type ExpectedCell = number | string | RegExp | ExpectedError;
export type Expected = ExpectedCell | ExpectedCell[][];

export interface HostCase {
  /** What is checked and its source. */
  readonly name: string;
  /** The functions.md area, one of the binding modules. */
  readonly area: string;
  /** Function id without namespace, e.g. "CMOL". */
  readonly id: string;
  readonly args: readonly CaseArg[];
  readonly expected: Expected;
  /** Decimals a number must match to (toBeCloseTo); default 9. */
  readonly digits?: number;
}

const col = (...cells: CaseCell[]): CaseCell[][] => cells.map((c) => [c]);
const row = (...cells: CaseCell[]): CaseCell[][] => [cells];
const err = (message: string | RegExp, error: ExpectedError["error"] = "#VALUE!"): ExpectedError => ({ error, message });

// Derived from IUPAC/CIAAW standard atomic weights (Ca 40.078, Mg 24.305, K 39.0983, Na 22.98977):
// mg/kg per cmol(+)/kg = atomic weight × 10 ÷ charge. Source: CIAAW 2021 standard atomic weights.
const CEC05 = { ca: 2000 / 200.39, mg: 180 / 121.525, k: 150 / 390.983, na: 30 / 229.8977, acidity: 2 };
const CEC05_SUM = CEC05.ca + CEC05.mg + CEC05.k + CEC05.na + CEC05.acidity;
const pctOf = (x: number) => (100 * x) / CEC05_SUM;

export const CASES: readonly HostCase[] = [
  // ---- units -------------------------------------------------------------------------------
  {
    name: "CONVERT mg/kg → kg/ha over 15 cm at 1.3 g/cm3 (UNIT-16, derived from the layer-mass definition)",
    area: "units",
    id: "CONVERT",
    args: [10, "mg/kg", "kg/ha", 15, 1.3],
    expected: 19.5,
  },
  {
    name: "CONVERT broadcasts a column of values against a column of units (UNIT-16 derived; lb/ac from the exact pound 0.45359237 kg and acre 4046.8564224 m2, derived)",
    area: "units",
    id: "CONVERT",
    args: [col(10, 20), "mg/kg", col("kg/ha", "lb/ac"), 15, 1.3],
    expected: [[19.5], [39 / (0.45359237 / 0.40468564224)]],
  },
  {
    name: "CONVERT without the density it needs is #VALUE! naming it (UNIT-16 inputs; message is the contract)",
    area: "units",
    id: "CONVERT",
    args: [10, "mg/kg", "kg/ha", 15],
    expected: err("converting mg/kg to kg/ha needs bulk_density (dry bulk density in g/cm3)"),
  },
  {
    name: "CONVERT with an argument left out in the middle takes its default (none: depth is asked for)",
    area: "units",
    id: "CONVERT",
    args: [10, "mg/kg", "kg/ha", undefined, 1.3],
    expected: err(/needs depth_cm/),
  },
  {
    name: "CMOL column spill with a blank and a negative element (IUPAC/CIAAW: 200.39 mg/kg Ca per cmol(+)/kg, derived)",
    area: "units",
    id: "CMOL",
    args: [col(200.39, null, -1), "Ca"],
    expected: [[1], [""], [err(/^mg_per_kg must be at least 0/)]],
  },
  {
    name: "CMOL accepts numeric text; a below-detection text is NOT_A_NUMBER with a hint (IUPAC/CIAAW derived; inputs invented)",
    area: "units",
    id: "CMOL",
    args: [col("200.39", "<5"), "Ca"],
    expected: [[1], [err(/^mg_per_kg: "<5" is not a number \(a below- or above-detection value/)]],
  },
  {
    name: "CMOL of an unknown ion lists the accepted ones (inputs invented)",
    area: "units",
    id: "CMOL",
    args: [200.39, "Xx"],
    expected: err('unknown ion "Xx"; use Ca, Mg, K, Na, NH4, H, Al or Mn'),
  },
  {
    name: "CMOL ranges of different shapes are one #VALUE! naming both (inputs invented)",
    area: "units",
    id: "CMOL",
    args: [row(1, 2), col("Ca", "Mg")],
    expected: err("mg_per_kg is 1×2 but ion is 2×1; ranges must have the same shape, or be a single cell"),
  },
  {
    // 2P / P2O5 = 61.948 / 141.943 = 0.436429, derived from IUPAC/CIAAW abridged atomic weights (Prohaska
    // et al. 2022, from memory); Virginia Tech SPES-201NP (seen) prints the rounded 0.4365.
    name: "OXIDE 2×2 block with a blank: P2O5 → P factor 0.436429 (derived from atomic weights; VT SPES-201NP prints 0.4365)",
    area: "units",
    id: "OXIDE",
    args: [
      [
        [100, 50],
        [null, 20],
      ],
      "P2O5",
      "P",
    ],
    expected: [
      [43.6429, 21.8214],
      ["", 8.7286],
    ],
    digits: 4,
  },
  // ---- cations -----------------------------------------------------------------------------
  {
    name: "CEC of the CEC-05 soil by summation, 13.976 cmol(+)/kg (derived from IUPAC equivalent weights)",
    area: "cations",
    id: "CEC",
    args: [2000, 180, 150, 30, "mg/kg", 2],
    expected: 13.976,
    digits: 3,
  },
  {
    name: "CEC column of Ca spills with blank in blank out and a per-element error (CEC-05 derived; other inputs invented)",
    area: "cations",
    id: "CEC",
    args: [col(2000, null, -1), 180, 150, 30, "mg/kg", 2],
    expected: [[13.976], [""], [err(/^ca must be at least 0 mg\/kg/)]],
    digits: 3,
  },
  {
    name: "SATURATION row of five parts of the CEC-05 soil (derived from IUPAC equivalent weights)",
    area: "cations",
    id: "SATURATION",
    args: [row("Ca", "Mg", "K", "Na", "acidity"), 2000, 180, 150, 30, "mg/kg", 2],
    expected: [[pctOf(CEC05.ca), pctOf(CEC05.mg), pctOf(CEC05.k), pctOf(CEC05.na), pctOf(CEC05.acidity)]],
    digits: 3,
  },
  {
    name: "SAR of 15, 6, 4 mmol(c)/L is 6.708 (CEC-10, derived from the USDA Handbook 60 SAR definition)",
    area: "cations",
    id: "SAR",
    args: [15, 6, 4, "mmolc/L"],
    expected: 6.708,
    digits: 3,
  },
  {
    name: "CEC with an unknown unit lists the accepted ones (inputs invented)",
    area: "cations",
    id: "CEC",
    args: [1, 1, 1, 1, "lbs", 0],
    expected: err('unknown unit "lbs" for unit; use mg/kg, g/kg, %, cmol(+)/kg, mmolc/kg, mg/dm3'),
  },
  {
    name: "CEC with the unit left blank is #VALUE!: the unit is required, never guessed (issue 22 point 3; inputs from the issue)",
    area: "cations",
    id: "CEC",
    args: [6, 1, 0.5, 0.2, null],
    expected: err(/^unit is required: the unit the lab reported the cations in \(mg\/kg, g\/kg, %, cmol\(\+\)\/kg, mmolc\/kg, mg\/dm3\)/),
  },
  {
    name: "SATURATION of bases of the issue's soil in meq/100g is ~98 %, not 13.7 % (issue 22; derived: 7.7 of 7.8 cmol(+)/kg)",
    area: "cations",
    id: "SATURATION",
    args: ["bases", 6, 1, 0.5, 0.2, "meq/100g", 0.1],
    expected: (100 * 7.7) / 7.8,
  },
  {
    name: "CAMG with a bare cmol/kg is #VALUE! naming the charge spellings (issue 22 point 5; definition: 1 cmol Ca2+ = 2 cmol(+))",
    area: "cations",
    id: "CAMG",
    args: [6, 1, "cmol/kg"],
    expected: err(/^unit "cmol\/kg" is ambiguous.*write cmol\(\+\)\/kg, cmolc\/kg or meq\/100g/),
  },
  {
    name: "ESP with a bare mmol/kg is #VALUE!; with mmolc/kg it is 100 × 20/200 = 10 % (issue 22 point 5; CEC-12 definition)",
    area: "cations",
    id: "ESP",
    args: [col(20, 20), 20, col("mmolc/kg", "mmol/kg")],
    expected: [[10], [err(/^unit "mmol\/kg" is ambiguous/)]],
  },
  {
    name: "SAR with the unit left blank is #VALUE! (issue 22 point 3: mg/L read as meq/L would be several times wrong)",
    area: "cations",
    id: "SAR",
    args: [230, 40, 24.3, null],
    expected: err(/^unit is required: the unit of na, ca and mg: mmolc\/L or mg\/L/),
  },
  {
    name: "CONVERT mg/L is #VALUE! naming mg/dm3 (issue 22 point 5: an extract concentration, not soil volume)",
    area: "units",
    id: "CONVERT",
    args: [26, "mg/L", "mg/kg", undefined, 1.3],
    expected: err(/^from_unit "mg\/L" is usually the concentration of an extract or a water.*write mg\/dm3/),
  },
  {
    name: "CONVERT Mg/ha is a tonne per hectare; mg/ha is refused, case matters there (issue 22 point 5; SI prefixes, NIST SP 811)",
    area: "units",
    id: "CONVERT",
    args: [2, col("Mg/ha", "mg/ha"), "kg/ha"],
    expected: [[2000], [err(/^from_unit "mg\/ha" would be milligrams per hectare/)]],
  },
  // ---- lab ---------------------------------------------------------------------------------
  {
    name: "LABVALUE spills a column of lab texts by the policy half; blank and n.a. stay blank (issue 22 point 6; policies: Floit et al. 1996 ASTM STP 1291, abstract seen; texts invented)",
    area: "lab",
    id: "LABVALUE",
    args: [col(12.4, "<0.5", null, "n.a.", "1 250"), "half"],
    expected: [[12.4], [0.25], [""], [""], [1250]],
  },
  {
    name: "LABVALUE of a censored value without a policy is #VALUE! in its own cell (issue 22 point 6: never assumed)",
    area: "lab",
    id: "LABVALUE",
    args: [col(7.9, "<0.05")],
    expected: [[7.9], [err('value "<0.05" is below detection: say how to count it with below: limit (0.05), half (0.025), zero or blank')]],
  },
  {
    name: "LABVALUE reads >300 by above, and 12,5 only with a stated decimal comma (issue 22 point 6; texts invented)",
    area: "lab",
    id: "LABVALUE",
    args: [col(">300", "12,5"), undefined, "limit", ","],
    expected: [[300], [12.5]],
  },
  {
    name: "LABVALUE of 12,5 with no decimal mark stated is #VALUE!, never guessed (issue 22 point 6)",
    area: "lab",
    id: "LABVALUE",
    args: ["12,5"],
    expected: err(/^value: "12,5" has a comma/),
  },
  {
    name: "LABVALUE of n.d. and trace: zero gives 0; half cannot apply, they state no limit (issue 22 point 6)",
    area: "lab",
    id: "LABVALUE",
    args: [col("n.d.", "trace", "trace"), col("zero", "zero", "half")],
    expected: [[0], [0], [err(/^value "trace" states no limit/)]],
  },
  // ---- nitrogen ----------------------------------------------------------------------------
  {
    name: "NDFA of the NFIX-02 case is 71.43 % (derived from the natural abundance equation)",
    area: "nitrogen",
    id: "NDFA",
    args: [6, 1, -1],
    expected: 71.43,
    digits: 2,
  },
  {
    name: "NDFA with reference equal to B cannot be computed (inputs invented; message is the contract)",
    area: "nitrogen",
    id: "NDFA",
    args: [-1, 0, -1],
    expected: err("d15n_reference equals b_value (-1 ‰): the natural abundance method cannot tell soil N from fixed N here"),
  },
  {
    name: "NFIXDM pasture rule 20 kg N/t over a column with a blank and an out-of-range DM (Source: Peoples et al. 2012, seen)",
    area: "nitrogen",
    id: "NFIXDM",
    args: [col(2, null, -1), "pasture"],
    expected: [[40], [""], [err(/^shoot_dm must be from 0 to 60 t\/ha/)]],
  },
  {
    name: "NFIXED of NFIX-04, 200 kg shoot N × 71.4 %, shoots only (derived)",
    area: "nitrogen",
    id: "NFIXED",
    args: [8, 2.5, 71.4, "shoot"],
    expected: 142.8,
  },
  {
    name: "NFIXED with root_factor omitted says a factor is needed (inputs invented)",
    area: "nitrogen",
    id: "NFIXED",
    args: [8, 2.5, 80],
    expected: err(/^root_factor is needed/),
  },
  {
    name: "NFIXED with shoot N typed as a fraction (0.025) is #VALUE! with the hint (issue 22 point 4; a real 0.5 % computes: 8 t × 0.5 % × 50 % = 20)",
    area: "nitrogen",
    id: "NFIXED",
    args: [8, col(0.5, 0.025), 50, "shoot"],
    expected: [[20], [err(/0\.025 looks like a fraction; enter 2\.5 for 2\.5 %/)]],
  },
  {
    name: "NDIFF with soil mineral N corrections, 250 − 90 + 40 − 60 (derived from the N-difference definition; inputs invented)",
    area: "nitrogen",
    id: "NDIFF",
    args: [250, 90, 40, 60],
    expected: 140,
  },
  {
    name: "NODRATING over a column of digs: 21/30 Adequate, 15/30 Borderline, none with 0 nodules (Source: University of Adelaide, Grower guide to assessing legume nodulation – Riverina, seen; counts invented)",
    area: "nitrogen",
    id: "NODRATING",
    args: [col(30, 30, 30), col(21, 15, 0), col(400, null, 0)],
    expected: [[/^Adequate: 70 % of plants adequately nodulated/], [/^Borderline: 50 % of plants/], [/^None: no nodules on the 30 plants dug/]],
  },
  {
    name: "NODCOUNT for lentil has no published per-plant count: #N/A (no invented rating; counts invented)",
    area: "nitrogen",
    id: "NODCOUNT",
    args: [30, 900, "lentil"],
    expected: err(/^no published nodules-per-plant count for lentil was found/, "#N/A"),
  },
  {
    name: "FIXSOILCOUNT field pea at pH 5.1 CaCl2 with 120 kg nitrate-N: pH and nitrate; Mo is possible, not counted (Sources: GRDC Paddock Practices 2022; Voisin et al. 2002; Cox, GRDC Communities; Molybdenum – NSW fact sheet; all seen; readings invented)",
    area: "nitrogen",
    id: "FIXSOILCOUNT",
    args: ["field pea", 5.1, "CaCl2", 120],
    expected: 2,
  },
  {
    name: "FIXSOIL with a blank nitrate cell lists the nitrate check as not made, never a blank result (Source: Cox, GRDC Communities, > 100 kg/ha; readings invented)",
    area: "nitrogen",
    id: "FIXSOIL",
    args: ["lentil", 6, "CaCl2", col(null)],
    expected: /nitrate-N at sowing: not given/,
  },
  // ---- lime --------------------------------------------------------------------------------
  {
    name: "LIMEBUFFER SIKORA-OR2025 buffer 6.0 to pH 5.6 is 1.7 ton/ac (Source: Moore 2025, OSU Extension EM 9585 Table 1, seen)",
    area: "lime",
    id: "LIMEBUFFER",
    args: [6, 5.6, "SIKORA-OR2025", undefined, undefined, "ton/ac"],
    expected: 1.7,
  },
  {
    name: "LIMEBUFFER with the calibration left blank is #VALUE!: there is no default calibration (issue 22 point 3)",
    area: "lime",
    id: "LIMEBUFFER",
    args: [6, 5.6, null],
    expected: err(/^calibration is required: .*SIKORA-OR2025, MEHLICH/),
  },
  {
    name: "LIMEPRODUCT(3, 0.95, 0.85) is #VALUE! with the fraction hint, not 37 151.7 t/ha (issue 22 point 4)",
    area: "lime",
    id: "LIMEPRODUCT",
    args: [3, 0.95, 0.85],
    expected: err(/^cce_pct must be from 5 to 250 % \(got 0\.95 %\); 0\.95 looks like a fraction; enter 95 for 95 %$/),
  },
  {
    name: "LIMEPRODUCT in percent: 3 t/ha at CCE 95 %, fineness 85 % (derived from the Penn State AASL CCE adjustment)",
    area: "lime",
    id: "LIMEPRODUCT",
    args: [3, 95, 85],
    expected: 3 / 0.95 / 0.85,
  },
  {
    name: "LIMEBASESAT(8.9, 0.5, 0.7) is #VALUE! with the fraction hint, not 0.0178 t/ha (issue 22 point 4)",
    area: "lime",
    id: "LIMEBASESAT",
    args: [8.9, 0.5, 0.7],
    expected: err(/^base_sat must be 0, or above 1 to 100 % \(got 0\.5 %\); 0\.5 looks like a fraction; enter 50 for 50 %/),
  },
  {
    name: "LIMEBASESAT's V2 at its bounds: 20 and 100 % compute, 19.999 is refused (PERCENT.targetBaseSat; worked example T 5.46, V1 8.42)",
    area: "lime",
    id: "LIMEBASESAT",
    args: [5.46, 8.42, row(20, 100, 19.999)],
    expected: [[(5.46 * (20 - 8.42) * 1.00086) / 100, (5.46 * (100 - 8.42) * 1.00086) / 100, err(/^target_base_sat must be from 20 to 100 %/)]],
    digits: 4,
  },
  {
    name: "LIMEBUFFER column of buffer pH spills; 4.0 is outside the table, not extrapolated (EM 9585 Table 1, seen)",
    area: "lime",
    id: "LIMEBUFFER",
    args: [col(6.5, 6, 4), 6, "SIKORA-OR2025", undefined, undefined, "ton/ac"],
    expected: [[1.2], [2.5], [err(/^buffer_ph 4 is outside the SIKORA-OR2025 table/)]],
  },
  {
    name: "LIMEAL with the factor left out takes 1.5: 2 cmol(+)/kg Al over 20 cm at 1.2 g/cm3 is 3.6031 t/ha CaCO3 (LIME-24, derived)",
    area: "lime",
    id: "LIMEAL",
    args: [2, undefined, 20, 1.2],
    expected: 3.6031,
    digits: 4,
  },
  {
    name: "FINENESS of limestone A, a whole column taken as one value, is 85.28 % (Source: BC Soil Factsheet 637.200-2, seen)",
    area: "lime",
    id: "FINENESS",
    args: [col(78.8, 10, 2.4, 7.8)],
    expected: 85.28,
  },
  {
    name: "CCE of dolomite given as 21.7 % Ca and 13.1 % Mg is 108.14 % (Source: MN Dept. of Agriculture composition, seen; stoichiometry, derived)",
    area: "lime",
    id: "CCE",
    args: [row(21.7, 13.1), row("Ca", "Mg")],
    expected: 108.13571,
    digits: 4,
  },
  // ---- bands -------------------------------------------------------------------------------
  {
    name: "BAND text results spill over a column with a blank; a limit belongs to the band above (limits 10/20/30/40 invented)",
    area: "bands",
    id: "BAND",
    args: [col(5, 25, null, 45), row(10, 20, 30, 40)],
    expected: [["Very low"], ["Optimum"], [""], ["Very high"]],
  },
  {
    name: "BAND with limits not ascending is #VALUE! with the reason (invented limits)",
    area: "bands",
    id: "BAND",
    args: [5, row(10, 30, 20, 40)],
    expected: err(/strictly ascending/),
  },
  {
    name: "ESPSAR of SAR 10 and 13 estimates ESP 11.8865 and 15.1931 % (Source: USDA Handbook 60 regression via OAC 165:10, secondary; arithmetic, derived)",
    area: "cations",
    id: "ESPSAR",
    args: [col(10, 13)],
    expected: [[11.88651], [15.19315]],
    digits: 4,
  },
  {
    name: "SUFFICIENCY Mehlich-3 K 110 mg/kg for corn by CEC 4 and 15 (Source: Culman et al. 2020, Tri-State Bulletin 974, as restated by OSU Ag BMPs, seen)",
    area: "bands",
    id: "SUFFICIENCY",
    args: ["K", 110, "corn", "Mehlich-3", col(4, 15)],
    expected: [["Optimal"], ["Deficient"]],
  },
  {
    name: "SUFFICIENCY KCl-40 S for canola on 0-30 cm cores: 6 below, 7.2 within the critical range 6.8-7.5 (Source: Anderson, Peverill & Brennan 2013, Crop & Pasture Science 64:523, abstract, seen)",
    area: "bands",
    id: "SUFFICIENCY",
    args: ["S", col(6, 7.2), "canola", "KCl-40", undefined, undefined, undefined, 30],
    expected: [["Below critical range"], ["Critical range (90 % of maximum yield)"]],
  },
  {
    name: "SUFFICIENCY Olsen P without its unit is #VALUE!: labs report it per kg or per litre of soil and the tables are in both (Sources: NI S.R. 2019/81 Sched. 5; Making More from Sheep Tool 7.3; seen)",
    area: "bands",
    id: "SUFFICIENCY",
    args: ["P", 13, "wheat", "Olsen"],
    expected: err(/^unit is needed/),
  },
  {
    name: "SUFFICIENCY with no table for the combination is #N/A (a gap in the shipped tables, not a value)",
    area: "bands",
    id: "SUFFICIENCY",
    args: ["P", 30, "barley", "Colwell"],
    expected: err(/no P Colwell table for barley/, "#N/A"),
  },
  {
    name: "REMOVAL corn 10 t/ha as P2O5 is 72.5 kg/ha, the midpoint of 6.6–7.9 kg/t (Source: OMAFA Field Crop News 2025 'Crop Removal Values' Table 1, seen; derived)",
    area: "bands",
    id: "REMOVAL",
    args: ["corn", 10, "P2O5", "t/ha"],
    expected: 72.5,
  },
  {
    name: "REMOVAL with yield_unit left blank is #VALUE! (issue 22 point 3); Mg/ha is t/ha and mg/ha is refused (point 5)",
    area: "bands",
    id: "REMOVAL",
    args: ["corn", 10, "P2O5", col("Mg/ha", null, "mg/ha")],
    expected: [[72.5], [err(/^yield_unit is required: /)], [err(/^yield_unit "mg\/ha" would be milligrams per hectare.*write Mg\/ha or t\/ha/)]],
  },
  {
    name: "BUILDUP over four years by default, 0 at or above the target (Tri-State build-up rule, derived; inputs invented)",
    area: "bands",
    id: "BUILDUP",
    args: [col(10, 20), 15, 20],
    expected: [[25], [0]],
  },
  // ---- meta --------------------------------------------------------------------------------
  {
    name: "VERSION names the package version (invented check of the format)",
    area: "meta",
    id: "VERSION",
    args: [],
    expected: /^soilcell \d+\.\d+\.\d+$/,
  },
  {
    name: "ABOUT of CMOL names its source (IUPAC)",
    area: "meta",
    id: "ABOUT",
    args: ["CMOL"],
    expected: /IUPAC/,
  },
  {
    name: "ABOUT of an unknown id lists the functions (invented id)",
    area: "meta",
    id: "ABOUT",
    args: ["NOPE"],
    expected: err(/^unknown function "NOPE"; use ABOUT, /),
  },
];

// ---------------------------------------------------------------------------------------------
// Writing a case as a formula

function literal(c: CaseCell): string {
  if (c === null) return '""';
  if (typeof c === "number") return String(c);
  return `"${c.replace(/"/g, '""')}"`;
}

function argText(a: CaseArg): string {
  if (a === undefined) return "";
  if (Array.isArray(a)) return `{${a.map((r) => r.map(literal).join(",")).join(";")}}`;
  return literal(a);
}

/** The formula a user would type for a case, e.g. `=SOIL.CMOL({200.39;"";-1},"Ca")`. */
export function formulaOf(c: HostCase): string {
  const args = [...c.args];
  while (args.length && args[args.length - 1] === undefined) args.pop();
  return `=SOIL.${c.id}(${args.map(argText).join(",")})`;
}

/** The arguments as Excel's runtime passes them to a matrix-only function of `paramCount` params. */
export function excelArgsOf(c: HostCase, paramCount: number): (CaseCell[][] | null)[] {
  const out: (CaseCell[][] | null)[] = [];
  for (let i = 0; i < paramCount; i++) {
    const a = c.args[i];
    out.push(a === undefined ? null : Array.isArray(a) ? a.map((r) => [...r]) : [[a]]);
  }
  return out;
}

// ---------------------------------------------------------------------------------------------
// Results, the same shape from every host

export interface ResultError {
  readonly error: string;
  readonly message: string;
}
export type ResultCell = number | string | ResultError;
export type Result = ResultCell | ResultCell[][];

function isExpectedError(e: unknown): e is ExpectedError {
  return typeof e === "object" && e !== null && !(e instanceof RegExp) && "error" in e;
}

/** Every way `actual` differs from `expected`, as lines (empty when it matches). */
export function mismatches(c: HostCase, actual: Result): string[] {
  const digits = c.digits ?? 9;
  const problems: string[] = [];
  const cellCheck = (where: string, e: ExpectedCell, a: ResultCell | undefined) => {
    const shown = JSON.stringify(a);
    if (isExpectedError(e)) {
      if (typeof a !== "object" || a === null) return problems.push(`${where}: expected ${e.error}, got ${shown}`);
      if (a.error !== e.error) problems.push(`${where}: expected ${e.error}, got ${a.error}`);
      const ok = typeof e.message === "string" ? a.message === e.message : e.message.test(a.message);
      if (!ok) problems.push(`${where}: message ${JSON.stringify(a.message)} does not match ${String(e.message)}`);
      return;
    }
    if (e instanceof RegExp) {
      if (typeof a !== "string" || !e.test(a)) problems.push(`${where}: expected text matching ${String(e)}, got ${shown}`);
      return;
    }
    if (typeof e === "number") {
      if (typeof a !== "number" || !(Math.abs(a - e) < 10 ** -digits / 2)) problems.push(`${where}: expected ${e} to ${digits} decimals, got ${shown}`);
      return;
    }
    if (a !== e) problems.push(`${where}: expected ${JSON.stringify(e)}, got ${shown}`);
  };
  if (Array.isArray(c.expected)) {
    if (!Array.isArray(actual)) return [`expected ${c.expected.length} rows, got the single value ${JSON.stringify(actual)}`];
    const want = c.expected;
    const shapeOk = actual.length === want.length && actual.every((r, i) => r.length === want[i]!.length);
    if (!shapeOk) return [`expected shape ${want.length}×${want[0]!.length}, got ${actual.length}×${actual[0]?.length ?? 0}`];
    want.forEach((r, i) => r.forEach((e, j) => cellCheck(`[${i}][${j}]`, e, actual[i]![j])));
  } else {
    if (Array.isArray(actual)) return [`expected a single value, got ${actual.length} rows ${JSON.stringify(actual)}`];
    cellCheck("value", c.expected, actual);
  }
  return problems;
}

/** A 1×1 grid is a single value, as a host shows it in one cell. */
export function unwrap(rows: ResultCell[][]): Result {
  return rows.length === 1 && rows[0]!.length === 1 ? rows[0]![0]! : rows;
}
