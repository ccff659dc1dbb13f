/**
 * evaluateFormula's own refusals and result shaping: references in a formula that has no workbook,
 * formulas written with ";" between arguments, syntax errors, formulas the engine does not compute,
 * spill shapes, and the clock behind NOW and TODAY. Values are invented to exercise the code's
 * logic; no published number. (45352 as the serial of 1 March 2024 in the 1900 date system is the
 * one tests/engine/dates.test.ts takes from LibreOffice.)
 */
import { localSerial } from "../../src/engine/book";
import { evaluateFormula } from "../../src/engine/evaluate";
import * as engine from "../../src/engine/formula/evaluate";
import * as parser from "../../src/engine/formula/parser";

const TAIL = "has nothing to read; give the values themselves (e.g. {1;2;3} for a column), or put the formula in a workbook and use soilcell recalc";
const refused = (what: string) => ({ error: "#REF!", message: `eval has no workbook, so ${what} ${TAIL}` });

describe("a reference in a formula without a workbook is refused, naming the first one typed", () => {
  it.each([
    ["=A1", "the reference A1"],
    ["=B3:D7", "the reference B3:D7"],
    ["=B3:B7", "the reference B3:B7"], // one column: still a range
    ["=B3:D3", "the reference B3:D3"], // one row: still a range
    ["=Sheet2!C4", "the reference Sheet2!C4"],
    ["=Sheet2!C4:E9", "the reference Sheet2!C4:E9"],
    ["=plot_ph", "the name plot_ph"],
    ["=C2#", "a spill reference (#)"],
    ["=SUM(1,C2)", "the reference C2"], // inside a function's arguments
    ["=SUM(D4,C2)", "the reference D4"],
    ["=D4+C2", "the reference D4"], // both sides of an operator
    ["=1+C2", "the reference C2"],
    ["=-C2", "the reference C2"],
    ["=+C2", "the reference C2"],
    ["=@C2", "the reference C2"],
    ["=C2%", "the reference C2"],
    ["=(D4,C2)", "the reference D4"], // a union
    ["=D4:E5 C2", "the reference D4:E5"], // an intersection
    ["=D4:E5:C2", "the reference D4:E5"], // a range of a range
    ["=SUM(1,-(2+plot_ph))", "the name plot_ph"], // nested several deep
  ])("%s names %s", (formula, what) => {
    expect(evaluateFormula(formula)).toEqual(refused(what));
  });

  it("a formula without references is not refused", () => {
    expect(evaluateFormula("=SUM(1,-(2+3))")).toEqual({ value: -4 });
  });

  it("a reference the formula builds (INDIRECT) is refused when read, not read as 0", () => {
    const indirect = {
      error: "#REF!",
      message:
        "eval has no workbook, so a reference the formula builds while computing (as INDIRECT does) has nothing to read; give the values themselves, or put the formula in a workbook and use soilcell recalc",
    };
    expect(evaluateFormula('=INDIRECT("C2")')).toEqual(indirect); // one cell
    expect(evaluateFormula('=INDIRECT("C2")+1')).toEqual(indirect); // one cell read as a value
    expect(evaluateFormula('=INDIRECT("C2:D3")')).toEqual(indirect); // a range, read whole
    expect(evaluateFormula('=SUM(INDIRECT("C2:D3"))')).toEqual(indirect); // visited cell by cell
    expect(evaluateFormula('=IFERROR(INDIRECT("C2"),5)')).toEqual(indirect); // not an error value IFERROR could swallow
    // Asking about the reference itself reads no cell.
    expect(evaluateFormula('=ROWS(INDIRECT("C2:D4"))')).toEqual({ value: 3 });
  });

  it("with blankReferences, references read as blank cells", () => {
    expect(evaluateFormula("=C2", { blankReferences: true })).toEqual({ value: 0 });
    expect(evaluateFormula("=C2:D3", { blankReferences: true })).toEqual({ value: [[0, 0], [0, 0]] });
    expect(evaluateFormula("=C2:D3+1", { blankReferences: true })).toEqual({ value: [[1, 1], [1, 1]] }); // array formula, not intersected
    expect(evaluateFormula('=INDIRECT("C2:E2")', { blankReferences: true })).toEqual({ value: [[0, 0, 0]] });
    expect(evaluateFormula('=SUM(INDIRECT("C2:D3"))', { blankReferences: true })).toEqual({ value: 0 });
    expect(evaluateFormula("=plot_ph", { blankReferences: true })).toEqual({ error: "#NAME?", message: 'there is no defined name "plot_ph"' });
    expect(evaluateFormula("=C2#", { blankReferences: true })).toEqual({ error: "#REF!", message: "eval has no workbook" });
  });

  it("a union at the top is #VALUE! (a cell cannot show one), not an object", () => {
    expect(evaluateFormula("=(C2,D4)", { blankReferences: true })).toEqual({ error: "#VALUE!", message: "a union of ranges cannot be used as an array" });
  });

  it("a range too large to read is refused, not thrown", () => {
    expect(evaluateFormula("=A:XFD", { blankReferences: true })).toEqual({
      error: "#VALUE!",
      message: "a formula asks for a range of 1048576×16384 cells, more than the 4000000 cells soilcell takes in one formula; refused",
    });
    expect(evaluateFormula('=INDIRECT("A:XFD")').message).toMatch(/^a formula asks for a range of 1048576×16384 cells/);
  });
});

describe('a formula with ";" between arguments is refused with the stored form to check', () => {
  const SAID = 'the formula separates its arguments with ";", as Excel shows formulas under some regional settings; soilcell reads formulas as Excel stores them, with ","';
  const hint = (message: string) => ({ error: "#VALUE!", message });

  it("the rewrite with , between arguments", () => {
    expect(evaluateFormula("=SUM(1;2)")).toEqual(hint(`${SAID}; as stored it reads =SUM(1,2) (check it, then run that)`));
  });
  it('decimal commas become "." in the rewrite, and the message says so', () => {
    expect(evaluateFormula('=SOIL.CONVERT(1,5;"t/ha";"kg/ha")')).toEqual(
      hint(`${SAID} and "." for decimals; as stored it reads =SOIL.CONVERT(1.5,"t/ha","kg/ha") (check it, then run that)`),
    );
  });
  it("text in quotes is copied as it is and its ; and , do not count", () => {
    expect(evaluateFormula('=CONCAT("a;b,c";1)')).toEqual(hint(`${SAID}; as stored it reads =CONCAT("a;b,c",1) (check it, then run that)`));
    expect(evaluateFormula("=CONCAT('x;y'!A1;1)")).toEqual(hint(`${SAID}; as stored it reads =CONCAT('x;y'!A1,1) (check it, then run that)`));
    // A doubled quote inside text: the text still ends where it should.
    expect(evaluateFormula('=CONCAT("say ""a;b""";2)')).toEqual(hint(`${SAID}; as stored it reads =CONCAT("say ""a;b""",2) (check it, then run that)`));
    expect(evaluateFormula('=CONCAT("a;b",1)')).toEqual({ value: "a;b1" });
    expect(evaluateFormula("=CONCAT('x;y'!A1,1)")).toEqual(refused("the reference x;y!A1"));
  });
  it("; inside an array constant is a row break, not an argument separator", () => {
    expect(evaluateFormula("=SUM({1;2},3)")).toEqual({ value: 6 });
    expect(evaluateFormula("=SUM({1,2},3)")).toEqual({ value: 6 });
  });
  it("with an array constant (or an unmatched brace) no rewrite is offered", () => {
    const noRewrite = hint(`${SAID}: write it with "," between arguments`);
    expect(evaluateFormula("=SUM({1;2};3)")).toEqual(noRewrite);
    expect(evaluateFormula("=SUM({1,2};3)")).toEqual(noRewrite); // the , inside braces is no decimal
    expect(evaluateFormula("=SUM(1;2})")).toEqual(noRewrite);
    expect(evaluateFormula("=SUM({1;2};3,5)")).toEqual(hint(`${SAID} and "." for decimals: write it with "," between arguments and "." for decimals`));
  });
});

describe("syntax, unsupported functions and result shapes", () => {
  it("a formula that cannot be read says where", () => {
    expect(evaluateFormula("=1+")).toEqual({ error: "#VALUE!", message: "the formula cannot be read: the formula ends too early" });
    expect(evaluateFormula("=SUM({1;2}")).toEqual({ error: "#VALUE!", message: 'the formula cannot be read: expected "," or ")" at 10' });
  });
  it("surrounding spaces and only the leading = are dropped", () => {
    expect(evaluateFormula("  =1+1  ")).toEqual({ value: 2 });
    expect(evaluateFormula("2=2")).toEqual({ value: true });
    expect(evaluateFormula("=2=3")).toEqual({ value: false });
  });
  it("a function the engine does not compute is #VALUE! naming it", () => {
    expect(evaluateFormula("=RAND()")).toEqual({ error: "#VALUE!", message: "RAND is not computed headless" });
  });
  it("an error with no message keeps an empty message", () => {
    expect(evaluateFormula("=NA()")).toEqual({ error: "#N/A", message: "" });
    expect(evaluateFormula("=1/0")).toEqual({ error: "#DIV/0!", message: "division by zero" });
  });
  it("a 1×1 array is a single value; anything larger spills with its shape", () => {
    expect(evaluateFormula("={7}")).toEqual({ value: 7 });
    expect(evaluateFormula("={7,8}")).toEqual({ value: [[7, 8]] });
    expect(evaluateFormula("={7;8}")).toEqual({ value: [[7], [8]] });
    expect(evaluateFormula('={1,"a";TRUE,4}')).toEqual({ value: [[1, "a"], [true, 4]] });
  });
  it("a spill whose top-left is an error carries that error beside the rows", () => {
    const r = evaluateFormula('=SOIL.CMOL({-1;200.39},"Ca")');
    expect(r.error).toBe("#VALUE!");
    expect(r.message).toBe("mg_per_kg must be at least 0 mg/kg (got -1 mg/kg)");
    const rows = r.value as unknown[][];
    expect(rows).toHaveLength(2);
    expect(rows[0]).toEqual(["#VALUE! mg_per_kg must be at least 0 mg/kg (got -1 mg/kg)"]);
    expect(rows[1]![0]).toBeCloseTo(1, 10);
    expect(Object.keys(evaluateFormula('=SOIL.CMOL({200.39;-1},"Ca")')).sort()).toEqual(["value"]); // an error lower down: no top-level error
  });
});

describe("NOW and TODAY", () => {
  const DAY = 86400000;
  it("localSerial counts local time from Excel's 1900 epoch", () => {
    const noon = Date.UTC(2024, 2, 1, 12); // 1 March 2024, 12:00 UTC
    expect(localSerial(noon, 0)).toBeCloseTo(45352.5, 10);
    expect(localSerial(noon, 300)).toBeCloseTo(45352.5 - 5 / 24, 10); // 5 h west of UTC: 07:00 local
    expect(localSerial(noon, -90)).toBeCloseTo(45352.5 + 1.5 / 24, 10); // 1.5 h east: 13:30 local
    expect(localSerial(noon + DAY, 0) - localSerial(noon, 0)).toBeCloseTo(1, 10);
  });
  it("NOW is the local clock as a serial, TODAY its whole day", () => {
    const local = () => {
      const d = new Date();
      return (Date.UTC(d.getFullYear(), d.getMonth(), d.getDate(), d.getHours(), d.getMinutes(), d.getSeconds(), d.getMilliseconds()) - Date.UTC(1899, 11, 30)) / DAY;
    };
    const before = local();
    const now = evaluateFormula("=NOW()").value as number;
    const today = evaluateFormula("=TODAY()").value as number;
    const after = local();
    expect(now).toBeGreaterThanOrEqual(before);
    expect(now).toBeLessThanOrEqual(after);
    expect([Math.floor(before), Math.floor(after)]).toContain(today);
  });
});

describe("an internal failure is not dressed up as a refusal", () => {
  afterEach(() => jest.restoreAllMocks());
  it("a parser crash that is no syntax error is thrown", () => {
    jest.spyOn(parser, "parseFormula").mockImplementation(() => {
      throw new TypeError("parser bug");
    });
    expect(() => evaluateFormula("=1+1")).toThrow(TypeError);
  });
  it("an evaluator crash is thrown", () => {
    jest.spyOn(engine, "ev").mockImplementation(() => {
      throw new TypeError("evaluator bug");
    });
    expect(() => evaluateFormula("=1+1")).toThrow(TypeError);
  });
});
