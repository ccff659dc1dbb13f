/**
 * The engine's text and date functions (src/engine/formula/functions/text.ts), computed in process
 * on a hand-made sheet (contents invented). Each case names its source:
 * - "LO": LibreOffice 7.4.7 headless computes the same value for the same cells and formula
 *   (oracle profile of scripts/oracle/lo.js), and Microsoft's function pages describe nothing different;
 * - "MS: …": Microsoft's Excel function documentation, where LibreOffice differs. LibreOffice holds
 *   TRUE and FALSE as the numbers 1 and 0 (so LEN(TRUE) is 1 there, 4 in Excel), numbers the days
 *   before 1 March 1900 one less than Excel (which counts 29 February 1900), has no 32,767-character
 *   text limit, and writes its "invalid argument" error as #VALUE! where Excel gives #NUM!;
 * - "XL: … (from memory)": Excel 365's behaviour as recalled, where LibreOffice differs;
 * - "behaviour: …": soilcell's documented refusal of what depends on the computer's locale.
 * Error cases check the code against the source and the message against soilcell's own wording.
 */
import { evaluateFormula } from "../../../../src/engine/evaluate";
import { compute, describeSheetCases } from "../../../helpers/sheet-eval";

const DATA: Record<string, number | string | boolean> = {"A1": "Hello World", "A2": "  a   b  ", "A3": 12.5, "A4": true, "A6": "abcabcabc", "A7": "2025-03-15", "A8": 45000.75, "B1": "a", "B2": "b", "B3": "", "B4": 3, "B5": false};
const DATA_FORMULAS: Record<string, string> = {};
const NAMES: { name: string; text: string }[] = [];

/** [formula (in H1, H2, … in this order), expected value or "#CODE message", source]. */
const CASES: [string, number | string | boolean, string][] = [
  ["LEN(A1)", 11, "LO"],
  ["LEN(A3)", 4, "LO"],
  ["LEN(A4)", 4, "XL:TRUE and FALSE as text are \"TRUE\" and \"FALSE\" (from memory; LO holds them as the numbers 1 and 0)"],
  ["LEN(A5)", 0, "LO"],
  ["LEN(\"\")", 0, "LO"],
  ["LEN(NA())", "#N/A", "LO"],
  ["LEN(1/3)", 17, "LO"],
  ["LEN(-0.5)", 4, "LO"],
  ["UPPER(\"abC\")", "ABC", "LO"],
  ["UPPER(A4)", "TRUE", "XL:TRUE and FALSE as text are \"TRUE\" and \"FALSE\" (from memory; LO holds them as the numbers 1 and 0)"],
  ["LOWER(\"AbC\")", "abc", "LO"],
  ["LOWER(A4)", "true", "XL:TRUE and FALSE as text are \"TRUE\" and \"FALSE\" (from memory; LO holds them as the numbers 1 and 0)"],
  ["UPPER(NA())", "#N/A", "LO"],
  ["TRIM(A2)", "a b", "LO"],
  ["TRIM(\"  x  \")", "x", "LO"],
  ["TRIM(\"x\")", "x", "LO"],
  ["TRIM(\" a b \")", "a b", "LO"],
  ["LEN(TRIM(\"   \"))", 0, "LO"],
  ["CLEAN(\"a\"&CHAR(9)&\"b\"&CHAR(31))", "ab", "LO"],
  ["CLEAN(\"abc\")", "abc", "LO"],
  ["LEN(CLEAN(CHAR(1)&\"x\"&CHAR(127)))", 2, "MS:CLEAN removes the first 32 nonprinting characters (codes 0 to 31) only; 127 stays (LO removes it too)"],
  ["LEFT(A1)", "H", "LO"],
  ["LEFT(A1,5)", "Hello", "LO"],
  ["LEFT(A1,0)", "", "LO"],
  ["LEFT(A1,100)", "Hello World", "LO"],
  ["LEFT(A1,-1)", "#VALUE! LEFT of a negative count", "LO"],
  ["LEFT(A1,2.9)", "He", "LO"],
  ["LEFT(A3,2)", "12", "LO"],
  ["LEFT(A1,\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["LEFT(NA(),1)", "#N/A", "LO"],
  ["RIGHT(A1)", "d", "LO"],
  ["RIGHT(A1,5)", "World", "LO"],
  ["RIGHT(A1,0)", "", "LO"],
  ["RIGHT(A1,100)", "Hello World", "LO"],
  ["RIGHT(A1,-1)", "#VALUE! RIGHT of a negative count", "LO"],
  ["RIGHT(A1,2.9)", "ld", "LO"],
  ["RIGHT(A4,2)", "UE", "XL:TRUE and FALSE as text are \"TRUE\" and \"FALSE\" (from memory; LO holds them as the numbers 1 and 0)"],
  ["RIGHT(A1,\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["MID(A1,7,5)", "World", "LO"],
  ["MID(A1,1,1)", "H", "LO"],
  ["MID(A1,11,5)", "d", "LO"],
  ["MID(A1,12,5)", "", "LO"],
  ["MID(A1,0,5)", "#VALUE! MID's start must be at least 1 and its length at least 0", "LO"],
  ["MID(A1,1,-1)", "#VALUE! MID's start must be at least 1 and its length at least 0", "LO"],
  ["MID(A1,3,0)", "", "LO"],
  ["MID(A1,2.9,2.9)", "el", "LO"],
  ["MID(A1,\"x\",1)", "#VALUE! text \"x\" is not a number", "LO"],
  ["MID(A1,1,\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["MID(A3,2,2)", "2.", "LO"],
  ["REPT(\"ab\",3)", "ababab", "LO"],
  ["REPT(\"ab\",0)", "", "LO"],
  ["REPT(\"ab\",-1)", "#VALUE! REPT of a negative count", "LO"],
  ["REPT(\"ab\",2.9)", "abab", "LO"],
  ["LEN(REPT(\"a\",32767))", 32767, "LO"],
  ["REPT(\"a\",32768)", "#VALUE! text longer than 32,767 characters", "MS:REPT: a result longer than 32,767 characters is #VALUE! (from memory of the REPT page; LO has no such limit)"],
  ["REPT(\"ab\",16384)", "#VALUE! text longer than 32,767 characters", "MS:REPT: a result longer than 32,767 characters is #VALUE! (from memory of the REPT page; LO has no such limit)"],
  ["REPT(\"ab\",\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["REPT(\"\",5)", "", "LO"],
  ["EXACT(\"a\",\"a\")", true, "LO"],
  ["EXACT(\"a\",\"A\")", false, "LO"],
  ["EXACT(1,\"1\")", true, "LO"],
  ["EXACT(A4,\"TRUE\")", true, "XL:TRUE and FALSE as text are \"TRUE\" and \"FALSE\" (from memory; LO holds them as the numbers 1 and 0)"],
  ["EXACT(NA(),1)", "#N/A", "LO"],
  ["EXACT(1,NA())", "#N/A", "LO"],
  ["EXACT(A5,\"\")", true, "LO"],
  ["SUBSTITUTE(A6,\"b\",\"X\")", "aXcaXcaXc", "LO"],
  ["SUBSTITUTE(A6,\"b\",\"X\",2)", "abcaXcabc", "LO"],
  ["SUBSTITUTE(A6,\"b\",\"X\",3)", "abcabcaXc", "LO"],
  ["SUBSTITUTE(A6,\"b\",\"X\",4)", "abcabcabc", "LO"],
  ["SUBSTITUTE(A6,\"b\",\"X\",0)", "#VALUE! SUBSTITUTE's instance must be at least 1", "LO"],
  ["SUBSTITUTE(A6,\"\",\"X\")", "abcabcabc", "LO"],
  ["SUBSTITUTE(A6,\"bc\",\"\")", "aaa", "LO"],
  ["SUBSTITUTE(A6,\"B\",\"X\")", "abcabcabc", "LO"],
  ["SUBSTITUTE(A6,\"b\",\"X\",1.9)", "aXcabcabc", "LO"],
  ["SUBSTITUTE(A6,\"b\",\"X\",\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["SUBSTITUTE(NA(),\"b\",\"X\")", "#N/A", "LO"],
  ["SUBSTITUTE(A6,NA(),\"X\")", "#N/A", "LO"],
  ["SUBSTITUTE(A6,\"b\",NA())", "#N/A", "LO"],
  ["SUBSTITUTE(\"aaa\",\"aa\",\"b\",2)", "aaa", "LO"],
  ["SUBSTITUTE(A3,\".\",\",\")", "12,5", "LO"],
  ["SUBSTITUTE(A6,\"abc\",\"Z\",1)", "Zabcabc", "LO"],
  ["FIND(\"o\",A1)", 5, "LO"],
  ["FIND(\"o\",A1,6)", 8, "LO"],
  ["FIND(\"O\",A1)", "#VALUE! the text is not found", "LO"],
  ["FIND(\"z\",A1)", "#VALUE! the text is not found", "LO"],
  ["FIND(\"\",A1)", 1, "MS:FIND: an empty find_text matches the character numbered start_num (LO: #VALUE!)"],
  ["FIND(\"\",A1,3)", 3, "MS:FIND: an empty find_text matches the character numbered start_num (LO: #VALUE!)"],
  ["FIND(\"o\",A1,0)", "#VALUE! the start position is outside the text", "LO"],
  ["FIND(\"o\",A1,12)", "#VALUE! the text is not found", "LO"],
  ["FIND(\"\",A1,13)", "#VALUE! the start position is outside the text", "LO"],
  ["FIND(\"d\",A1,11)", 11, "LO"],
  ["FIND(\"o\",A1,\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["FIND(NA(),A1)", "#N/A", "LO"],
  ["FIND(\"o\",NA())", "#N/A", "LO"],
  ["FIND(\"*\",\"a*b\")", 2, "LO"],
  ["FIND(\"o\",A1,5.9)", 5, "LO"],
  ["SEARCH(\"O\",A1)", 5, "LO"],
  ["SEARCH(\"world\",A1)", 7, "LO"],
  ["SEARCH(\"w?r\",A1)", 7, "LO"],
  ["SEARCH(\"w*d\",A1)", 7, "LO"],
  ["SEARCH(\"l*o\",A1)", 3, "LO"],
  ["SEARCH(\"~*\",\"a*b\")", 2, "LO"],
  ["SEARCH(\"~?\",\"a?b\")", 2, "LO"],
  ["SEARCH(\"~~\",\"a~b~\")", 2, "LO"],
  ["SEARCH(\"b~\",\"ab~\")", 2, "LO"],
  ["SEARCH(\"z*\",A1)", "#VALUE! the text is not found", "LO"],
  ["SEARCH(\"o\",A1,6)", 8, "LO"],
  ["SEARCH(\"?\",A1,3)", 3, "LO"],
  ["SEARCH(\"(\",\"a(b\")", 2, "LO"],
  ["SEARCH(\".\",\"a.b\")", 2, "LO"],
  ["SEARCH(\"*\",\"abc\")", 1, "LO"],
  ["SEARCH(\"x\",A1)", "#VALUE! the text is not found", "LO"],
  ["SEARCH(\"o*\",A1,9)", "#VALUE! the text is not found", "LO"],
  ["SEARCH(\"O\",A1,0)", "#VALUE! the start position is outside the text", "LO"],
  ["SEARCH(\"O?L\",A1,3)", 8, "LO"],
  ["CONCATENATE(\"a\",1,TRUE)", "a1TRUE", "XL:TRUE and FALSE as text are \"TRUE\" and \"FALSE\" (from memory; LO holds them as the numbers 1 and 0)"],
  ["CONCATENATE(A1,\"!\")", "Hello World!", "LO"],
  ["CONCATENATE(A5,\"x\")", "x", "LO"],
  ["CONCATENATE(NA(),\"x\")", "#N/A", "LO"],
  ["CONCATENATE(\"x\",NA())", "#N/A", "LO"],
  ["LEN(CONCATENATE(REPT(\"a\",32767),\"b\"))", "#VALUE! text longer than 32,767 characters", "MS:CONCAT: a result longer than 32,767 characters (the cell limit) is #VALUE! (LO has no such limit)"],
  ["CONCATENATE(A3,B5)", "12.5FALSE", "XL:TRUE and FALSE as text are \"TRUE\" and \"FALSE\" (from memory; LO holds them as the numbers 1 and 0)"],
  ["_xlfn.CONCAT(B1:B5)", "ab3FALSE", "XL:TRUE and FALSE as text are \"TRUE\" and \"FALSE\" (from memory; LO holds them as the numbers 1 and 0)"],
  ["_xlfn.CONCAT(\"x\",B1:B2,1)", "xab1", "LO"],
  ["_xlfn.CONCAT(A5)", "", "LO"],
  ["_xlfn.CONCAT(NA())", "#N/A", "LO"],
  ["_xlfn.CONCAT({\"a\",\"b\";\"c\",\"d\"})", "abcd", "LO"],
  ["LEN(_xlfn.CONCAT(REPT(\"a\",32767),\"b\"))", "#VALUE! text longer than 32,767 characters", "MS:CONCAT: a result longer than 32,767 characters (the cell limit) is #VALUE! (LO has no such limit)"],
  ["_xlfn.TEXTJOIN(\"-\",TRUE,B1:B5)", "a-b-3-FALSE", "XL:TRUE and FALSE as text are \"TRUE\" and \"FALSE\" (from memory; LO holds them as the numbers 1 and 0)"],
  ["_xlfn.TEXTJOIN(\"-\",FALSE,B1:B5)", "a-b--3-FALSE", "XL:TRUE and FALSE as text are \"TRUE\" and \"FALSE\" (from memory; LO holds them as the numbers 1 and 0)"],
  ["_xlfn.TEXTJOIN(\", \",TRUE,\"a\",\"\",\"b\")", "a, b", "LO"],
  ["_xlfn.TEXTJOIN(\"\",TRUE,B1:B4)", "ab3", "LO"],
  ["_xlfn.TEXTJOIN(\"-\",,B1:B3)", "a-b-", "LO"],
  ["_xlfn.TEXTJOIN(NA(),TRUE,B1:B2)", "#N/A", "LO"],
  ["_xlfn.TEXTJOIN(\"-\",TRUE,NA())", "#N/A", "LO"],
  ["_xlfn.TEXTJOIN(1,TRUE,\"a\",\"b\")", "a1b", "LO"],
  ["_xlfn.TEXTJOIN(\"-\",FALSE,A5,A5)", "-", "LO"],
  ["_xlfn.TEXTJOIN(\"-\",1,B1:B3)", "a-b", "LO"],
  ["_xlfn.TEXTJOIN(\"-\",0,B1:B3)", "a-b-", "LO"],
  ["VALUE(\"12.5\")", 12.5, "LO"],
  ["VALUE(\" 7 \")", 7, "LO"],
  ["VALUE(\"1e3\")", 1000, "LO"],
  ["VALUE(\"-4\")", -4, "LO"],
  ["VALUE(A3)", 12.5, "LO"],
  ["VALUE(NA())", "#N/A", "LO"],
  ["VALUE(\"50%\")", 0.5, "LO"],
  ["CHAR(65)", "A", "LO"],
  ["CHAR(97)", "a", "LO"],
  ["CHAR(1)", "\u0001", "LO:the same character, which LO writes as _x0001_ in the file (ECMA-376 escape)"],
  ["CHAR(127)", "", "LO"],
  ["CHAR(0)", "#VALUE! CHAR takes 1 to 255", "MS:CHAR takes a number between 1 and 255 (LO returns a character)"],
  ["CHAR(256)", "#VALUE! CHAR takes 1 to 255", "LO"],
  ["CHAR(65.9)", "A", "LO"],
  ["CHAR(\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["CHAR(-1)", "#VALUE! CHAR takes 1 to 255", "LO"],
  ["CODE(\"A\")", 65, "LO"],
  ["CODE(\"abc\")", 97, "LO"],
  ["CODE(\"\")", "#VALUE! CODE of empty text", "XL:#VALUE! (from memory; LO: 0)"],
  ["CODE(1)", 49, "LO"],
  ["CODE(A4)", 84, "XL:TRUE and FALSE as text are \"TRUE\" and \"FALSE\" (from memory; LO holds them as the numbers 1 and 0)"],
  ["CODE(NA())", "#N/A", "LO"],
  ["CODE(CHAR(127))", 127, "LO"],
  ["DATE(2025,1,15)", 45672, "LO"],
  ["DATE(2025,13,1)", 46023, "LO"],
  ["DATE(2025,1,0)", 45657, "LO"],
  ["DATE(2025,0,1)", 45627, "LO"],
  ["DATE(2024,2,29)", 45351, "LO"],
  ["DATE(1900,1,1)", 1, "MS:DATE: January 1, 1900 is serial number 1, and Excel counts 29 February 1900 (Microsoft's note on Excel's 1900 leap-year compatibility); LO numbers days before March 1900 one less"],
  ["DATE(1900,2,29)", 61, "LO"],
  ["DATE(1900,3,1)", 61, "LO"],
  ["DATE(1900,2,28)", 59, "MS:DATE: January 1, 1900 is serial number 1, and Excel counts 29 February 1900 (Microsoft's note on Excel's 1900 leap-year compatibility); LO numbers days before March 1900 one less"],
  ["DATE(99,1,1)", 36161, "LO"],
  ["DATE(0,1,1)", 1, "MS:DATE: a year from 0 to 1899 is added to 1900 (LO reads 0 as 2000)"],
  ["DATE(1899,12,31)", 693962, "MS:DATE: a year from 0 to 1899 is added to 1900, so 1899 is year 3799 (LO reads 1899 as itself)"],
  ["DATE(10000,1,1)", "#NUM! year 10000 is outside 0 to 9999", "MS:DATE: a year of 10000 or more is #NUM! (LO computes it)"],
  ["DATE(-1,1,1)", "#NUM! year -1 is outside 0 to 9999", "MS:DATE: a year less than 0 is #NUM! (LO: #VALUE!)"],
  ["DATE(9999,12,31)", 2958465, "LO"],
  ["DATE(2025.9,1.9,1.9)", 45658, "LO"],
  ["DATE(\"x\",1,1)", "#VALUE! text \"x\" is not a number", "LO"],
  ["DATE(2025,\"x\",1)", "#VALUE! text \"x\" is not a number", "LO"],
  ["DATE(2025,1,\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["DATE(1900,1,0)", 0, "XL:serial 0, shown as 0 January 1900 (from memory; LO numbers it 1)"],
  ["DATE(1900,1,-1)", "#NUM! the date is before 1900, the start of this workbook's date system", "XL:before serial 0 is #NUM! (from memory; LO: 0)"],
  ["DATE(2025,-1,1)", 45597, "LO"],
  ["YEAR(45000)", 2023, "LO"],
  ["MONTH(45000)", 3, "LO"],
  ["DAY(45000)", 15, "LO"],
  ["YEAR(60)", 1900, "LO"],
  ["MONTH(60)", 2, "LO"],
  ["DAY(60)", 29, "MS:DATE: January 1, 1900 is serial number 1, and Excel counts 29 February 1900 (Microsoft's note on Excel's 1900 leap-year compatibility); LO numbers days before March 1900 one less"],
  ["DAY(59)", 28, "MS:DATE: January 1, 1900 is serial number 1, and Excel counts 29 February 1900 (Microsoft's note on Excel's 1900 leap-year compatibility); LO numbers days before March 1900 one less"],
  ["DAY(61)", 1, "LO"],
  ["MONTH(61)", 3, "LO"],
  ["YEAR(0)", 1900, "XL:serial 0 is 0 January 1900 (from memory; LO: 30 December 1899)"],
  ["MONTH(0)", 1, "XL:serial 0 is 0 January 1900 (from memory; LO: 30 December 1899)"],
  ["DAY(0)", 0, "XL:serial 0 is 0 January 1900 (from memory; LO: 30 December 1899)"],
  ["YEAR(1)", 1900, "MS:DATE: January 1, 1900 is serial number 1, and Excel counts 29 February 1900 (Microsoft's note on Excel's 1900 leap-year compatibility); LO numbers days before March 1900 one less"],
  ["DAY(1)", 1, "MS:DATE: January 1, 1900 is serial number 1, and Excel counts 29 February 1900 (Microsoft's note on Excel's 1900 leap-year compatibility); LO numbers days before March 1900 one less"],
  ["YEAR(-1)", "#NUM! a negative date", "XL:a negative serial is #NUM! (from memory; LO: 1899)"],
  ["YEAR(A8)", 2023, "LO"],
  ["DAY(45000.99)", 15, "LO"],
  ["YEAR(\"45000\")", 2023, "LO"],
  ["YEAR(\"x\")", "not computed: it reads H203, which is not computed headless (reading the date in text \"x\" depends on the computer's locale; not computed headless)", "behaviour: text dates and TEXT's format codes depend on the computer's locale; refused, not guessed (text.ts header; LO: #VALUE! or a locale's result)"],
  ["MONTH(TRUE)", 1, "XL:TRUE is serial 1, 1 January 1900 (from memory; LO: December 1899)"],
  ["DAY(A5)", 0, "XL:serial 0 is 0 January 1900 (from memory; LO: 30 December 1899)"],
  ["YEAR(2958465)", 9999, "LO"],
  ["YEAR(NA())", "#N/A", "LO"],
  ["DATEVALUE(\"2025-03-15\")", 45731, "LO"],
  ["DATEVALUE(A7)", 45731, "LO"],
  ["DATEVALUE(\" 2025-3-5 \")", 45721, "LO"],
  ["DATEVALUE(NA())", "#N/A", "LO"],
  ["DATEVALUE(\"1900-03-01\")", 61, "LO"],
  ["DATEVALUE(\"1900-02-28\")", 59, "MS:DATE: January 1, 1900 is serial number 1, and Excel counts 29 February 1900 (Microsoft's note on Excel's 1900 leap-year compatibility); LO numbers days before March 1900 one less"],
  ["TIME(12,0,0)", 0.5, "LO"],
  ["TIME(6,30,15)", 0.27100694444444445, "LO"],
  ["TIME(0,0,0)", 0, "LO"],
  ["TIME(24,0,0)", 0, "LO"],
  ["TIME(25,0,0)", 0.041666666666666664, "LO"],
  ["TIME(0,-1,0)", "#NUM! a negative time", "XL:a negative time is #NUM! (from memory; LO: #VALUE!)"],
  ["TIME(1,-30,0)", 0.020833333333333332, "LO"],
  ["TIME(0,0,-1)", "#NUM! a negative time", "XL:a negative time is #NUM! (from memory; LO: #VALUE!)"],
  ["TIME(12.9,0,0)", 0.5, "XL:TIME truncates its arguments to whole numbers (from memory; LO keeps 0.9 hour)"],
  ["TIME(\"x\",0,0)", "#VALUE! text \"x\" is not a number", "LO"],
  ["TIME(0,\"x\",0)", "#VALUE! text \"x\" is not a number", "LO"],
  ["TIME(0,0,\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["TIME(0,90,0)", 0.0625, "LO"],
  ["HOUR(0.5)", 12, "LO"],
  ["HOUR(0.75)", 18, "LO"],
  ["MINUTE(0.5)", 0, "LO"],
  ["MINUTE(TIME(6,45,0))", 45, "LO"],
  ["SECOND(TIME(6,45,30))", 30, "LO"],
  ["HOUR(A8)", 18, "LO"],
  ["MINUTE(A8)", 0, "LO"],
  ["SECOND(0.999999)", 0, "LO"],
  ["HOUR(-1)", "#NUM! a negative time", "XL:a negative serial is #NUM! (from memory; LO: 0)"],
  ["HOUR(\"x\")", "not computed: it reads H236, which is not computed headless (reading the date in text \"x\" depends on the computer's locale; not computed headless)", "behaviour: text dates and TEXT's format codes depend on the computer's locale; refused, not guessed (text.ts header; LO: #VALUE! or a locale's result)"],
  ["HOUR(\"2025-03-15\")", 0, "LO"],
  ["HOUR(\"0.25\")", 6, "LO"],
  ["SECOND(1.5)", 0, "LO"],
  ["MINUTE(NA())", "#N/A", "LO"],
  ["HOUR(A5)", 0, "LO"],
  ["HOUR(45000.0000057870)", 0, "LO"],
  ["WEEKDAY(45000)", 4, "LO"],
  ["WEEKDAY(45000,1)", 4, "LO"],
  ["WEEKDAY(45000,2)", 3, "LO"],
  ["WEEKDAY(45000,3)", 2, "LO"],
  ["WEEKDAY(45000,11)", 3, "LO"],
  ["WEEKDAY(45000,12)", 2, "LO"],
  ["WEEKDAY(45000,13)", 1, "LO"],
  ["WEEKDAY(45000,14)", 7, "LO"],
  ["WEEKDAY(45000,15)", 6, "LO"],
  ["WEEKDAY(45000,16)", 5, "LO"],
  ["WEEKDAY(45000,17)", 4, "LO"],
  ["WEEKDAY(45000,4)", "#NUM! WEEKDAY type 4 is not one Excel has", "MS:WEEKDAY: a return_type outside the table is #NUM! (LO: #VALUE!)"],
  ["WEEKDAY(45000,0)", "#NUM! WEEKDAY type 0 is not one Excel has", "MS:WEEKDAY: a return_type outside the table is #NUM! (LO: #VALUE!)"],
  ["WEEKDAY(45000,18)", "#NUM! WEEKDAY type 18 is not one Excel has", "MS:WEEKDAY: a return_type outside the table is #NUM! (LO: #VALUE!)"],
  ["WEEKDAY(-1)", "#NUM! a negative date", "MS:WEEKDAY: a serial_number out of range for the date base is #NUM! (LO: 6)"],
  ["WEEKDAY(1)", 1, "LO"],
  ["WEEKDAY(0)", 7, "LO"],
  ["WEEKDAY(\"2025-03-15\")", 7, "LO"],
  ["WEEKDAY(45000,\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["WEEKDAY(\"x\")", "not computed: it reads H262, which is not computed headless (reading the date in text \"x\" depends on the computer's locale; not computed headless)", "behaviour: text dates and TEXT's format codes depend on the computer's locale; refused, not guessed (text.ts header; LO: #VALUE! or a locale's result)"],
  ["WEEKDAY(45001,2)", 4, "LO"],
  ["WEEKDAY(45002,3)", 4, "LO"],
  ["WEEKDAY(45003,1)", 7, "LO"],
  ["WEEKDAY(45004,17)", 1, "LO"],
  ["WEEKDAY(45005,16)", 3, "LO"],
  ["WEEKDAY(45006,12)", 1, "LO"],
  ["EDATE(45000,1)", 45031, "LO"],
  ["EDATE(45000,-1)", 44972, "LO"],
  ["EDATE(DATE(2025,1,31),1)", 45716, "LO"],
  ["EDATE(DATE(2024,1,31),1)", 45351, "LO"],
  ["EDATE(DATE(2025,3,31),-1)", 45716, "LO"],
  ["EDATE(DATE(2025,1,15),12)", 46037, "LO"],
  ["EDATE(45000,1.9)", 45031, "LO"],
  ["EDATE(\"2025-01-31\",1)", 45716, "LO"],
  ["EDATE(45000,\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["EDATE(DATE(1900,1,1),-1)", "#NUM! the date is before 1900, the start of this workbook's date system", "XL:a date before the 1900 system's start is #NUM! (from memory; LO: -29)"],
  ["EDATE(45000.5,1)", 45031, "LO"],
  ["EOMONTH(DATE(2025,1,15),0)", 45688, "LO"],
  ["EOMONTH(DATE(2025,1,15),1)", 45716, "LO"],
  ["EOMONTH(DATE(2024,1,15),1)", 45351, "LO"],
  ["EOMONTH(DATE(2025,1,15),-1)", 45657, "LO"],
  ["EOMONTH(DATE(2025,12,15),1)", 46053, "LO"],
  ["EOMONTH(DATE(2025,1,15),\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["EOMONTH(\"2025-02-10\",0)", 45716, "LO"],
  ["EOMONTH(\"x\",0)", "not computed: it reads H287, which is not computed headless (reading the date in text \"x\" depends on the computer's locale; not computed headless)", "behaviour: text dates and TEXT's format codes depend on the computer's locale; refused, not guessed (text.ts header; LO: #VALUE! or a locale's result)"],
  ["_xlfn.DAYS(DATE(2025,3,15),DATE(2025,1,1))", 73, "LO"],
  ["_xlfn.DAYS(DATE(2025,1,1),DATE(2025,3,15))", -73, "LO"],
  ["_xlfn.DAYS(\"2025-03-15\",\"2025-03-01\")", 14, "LO"],
  ["_xlfn.DAYS(45000.75,45000)", 0.75, "LO"],
  ["_xlfn.DAYS(NA(),1)", "#N/A", "LO"],
  ["_xlfn.DAYS(1,NA())", "#N/A", "LO"],
  ["_xlfn.DAYS(\"x\",1)", "not computed: it reads H294, which is not computed headless (reading the date in text \"x\" depends on the computer's locale; not computed headless)", "behaviour: text dates and TEXT's format codes depend on the computer's locale; refused, not guessed (text.ts header; LO: #VALUE! or a locale's result)"],
  ["DATEDIF(DATE(2020,1,15),DATE(2025,3,10),\"Y\")", 5, "LO"],
  ["DATEDIF(DATE(2020,1,15),DATE(2025,3,10),\"M\")", 61, "LO"],
  ["DATEDIF(DATE(2020,1,15),DATE(2025,3,10),\"D\")", 1881, "LO"],
  ["DATEDIF(DATE(2020,1,15),DATE(2025,3,10),\"YM\")", 1, "LO"],
  ["DATEDIF(DATE(2020,1,15),DATE(2025,3,15),\"M\")", 62, "LO"],
  ["DATEDIF(DATE(2020,1,15),DATE(2025,1,14),\"Y\")", 4, "LO"],
  ["DATEDIF(DATE(2020,1,15),DATE(2025,1,15),\"Y\")", 5, "LO"],
  ["DATEDIF(DATE(2025,3,10),DATE(2020,1,15),\"Y\")", "#NUM! DATEDIF's start date is after its end date", "MS:DATEDIF: a start_date greater than the end_date is #NUM! (LO: #VALUE!)"],
  ["DATEDIF(DATE(2020,1,15),DATE(2025,3,10),\"y\")", 5, "LO"],
  ["DATEDIF(45000,45000,\"D\")", 0, "LO"],
  ["DATEDIF(45000.9,45001.1,\"D\")", 1, "LO"],
  ["DATEDIF(NA(),1,\"D\")", "#N/A", "LO"],
  ["DATEDIF(1,NA(),\"D\")", "#N/A", "LO"],
  ["DATEDIF(1,2,NA())", "#N/A", "LO"],
  ["DATEDIF(\"2025-01-01\",\"2025-02-01\",\"D\")", 31, "LO"],
  ["DATEDIF(DATE(2020,5,20),DATE(2025,3,10),\"YM\")", 9, "LO"],
  ["TEXT(1,\"0\")", "not computed: it reads H311, which is not computed headless (TEXT's format codes depend on the computer's locale; not computed headless)", "behaviour: text dates and TEXT's format codes depend on the computer's locale; refused, not guessed (text.ts header; LO: #VALUE! or a locale's result)"],
  ["ISNUMBER(TODAY())", true, "LO"],
  ["TODAY()=INT(NOW())", true, "LO"],
  ["NOW()>=TODAY()", true, "LO"],
  ["_xlfn.TEXTJOIN(\"-\",FALSE,B1:B6)", "a-b--3-FALSE-", "XL:TRUE and FALSE as text are \"TRUE\" and \"FALSE\" (from memory; LO holds them as the numbers 1 and 0)"],
  ["_xlfn.TEXTJOIN(\"-\",TRUE,B1:B6)", "a-b-3-FALSE", "XL:TRUE and FALSE as text are \"TRUE\" and \"FALSE\" (from memory; LO holds them as the numbers 1 and 0)"],
  ["_xlfn.TEXTJOIN(\"-\",\"FALSE\",B1:B3)", "a-b-", "LO"],
  ["_xlfn.TEXTJOIN(\"-\",\"x\",B1:B3)", "#VALUE! text \"x\" is not TRUE or FALSE", "LO"],
  ["SUBSTITUTE(\"aaaa\",\"aa\",\"b\",2)", "aab", "LO"],
  ["SUBSTITUTE(\"aaaa\",\"aa\",\"b\")", "bb", "LO"],
  ["_xlfn.TEXTJOIN(\"-\",FALSE,\"a\",A5,\"b\")", "a--b", "LO"],
  ["TIME(32767,0,0)", 0.2916666666666667, "LO 7.4 headless"],
  ["TIME(32768,0,0)", "not computed: it reads H323, which is not computed headless (TIME with an argument above 32767 (outside the range Microsoft documents) is not computed headless)", "behaviour: MS:TIME: hour, minute and second are each 0 to 32767; beyond it Excel's result is not documented (LO computes 0.333…), so refused (found by scripts/oracle/differential.js)"],
  ["TIME(0,0,123456)", "not computed: it reads H324, which is not computed headless (TIME with an argument above 32767 (outside the range Microsoft documents) is not computed headless)", "behaviour: MS:TIME: hour, minute and second are each 0 to 32767"],
];

describeSheetCases("text functions on a sheet", CASES, DATA, DATA_FORMULAS, { names: NAMES });

/** The same functions in a workbook with the 1904 date system: [formula, expected, source]. */
const CASES_1904: [string, number | string | boolean, string][] = [
  ["DATE(1904,1,1)", 0, "LO"],
  ["DATE(1904,1,2)", 1, "LO"],
  ["DATE(1903,12,31)", "#NUM! the date is before 1904, the start of this workbook's date system", "XL:a date before the 1904 system's start is #NUM! (from memory; LO: -1)"],
  ["DATE(2025,3,15)", 44269, "LO"],
  ["YEAR(0)", 1904, "LO"],
  ["MONTH(0)", 1, "LO"],
  ["DAY(0)", 1, "LO"],
  ["DAY(1)", 2, "LO"],
  ["YEAR(43538)", 2023, "LO"],
  ["DATEVALUE(\"2025-03-15\")", 44269, "LO"],
  ["WEEKDAY(0)", 6, "LO"],
  ["WEEKDAY(1,2)", 6, "LO"],
  ["WEEKDAY(43538)", 4, "LO"],
  ["EDATE(0,1)", 31, "LO"],
  ["EOMONTH(0,1)", 59, "LO"],
  ["DATE(1904,2,29)", 59, "LO"],
  ["DAY(59)", 29, "LO"],
  ["HOUR(0.25)", 6, "LO"],
  ["_xlfn.DAYS(\"2025-03-15\",\"2025-03-01\")", 14, "LO"],
  ["DATEDIF(0,366,\"Y\")", 1, "LO"],
];

describeSheetCases("date functions in the 1904 date system (serial 0 is 1 January 1904, a Friday)", CASES_1904, { A1: 0 }, {}, { date1904: true });

describe("text functions over arrays, and what is refused", () => {
  it("text functions lift over arrays element by element (LibreOffice 7.4 computes the same as an array formula)", () => {
    expect(evaluateFormula('=UPPER({"a","b"})')).toEqual({ value: [["A", "B"]] });
    expect(evaluateFormula('=LEN({"ab";"cde"})')).toEqual({ value: [[2], [3]] });
    expect(evaluateFormula('=LEFT("abc",{1,2})')).toEqual({ value: [["a", "ab"]] });
  });
  it("what depends on the computer's locale or code page is refused, not guessed (behaviour: text.ts header)", () => {
    expect(evaluateFormula('=TEXTJOIN({"-","+"},TRUE,"a","b")')).toEqual({ error: "#VALUE!", message: "TEXTJOIN with an array of delimiters is not computed headless" });
    expect(evaluateFormula('=TEXTJOIN("-",{TRUE,FALSE},"a","b")')).toEqual({ error: "#VALUE!", message: "TEXTJOIN with an array for ignore_empty is not computed headless" });
    expect(evaluateFormula('=VALUE("1,234")')).toEqual({ error: "#VALUE!", message: "VALUE(\"1,234\") depends on the computer's locale; not computed headless" });
    expect(evaluateFormula("=CHAR(128)")).toEqual({ error: "#VALUE!", message: "CHAR above 127 depends on the computer's code page; not computed headless" });
    expect(evaluateFormula("=CHAR(255)").message).toBe("CHAR above 127 depends on the computer's code page; not computed headless");
    expect(evaluateFormula('=CODE("é")')).toEqual({ error: "#VALUE!", message: "CODE above 127 depends on the computer's code page; not computed headless" });
    expect(evaluateFormula('=TEXT(1,"0.0")')).toEqual({ error: "#VALUE!", message: "TEXT's format codes depend on the computer's locale; not computed headless" });
    expect(evaluateFormula('=DATEVALUE("15/03/2025")')).toEqual({ error: "#VALUE!", message: 'DATEVALUE("15/03/2025"): only ISO dates (2025-01-02) read the same in every locale; not computed headless' });
    expect(evaluateFormula('=DAY("15 March")')).toEqual({ error: "#VALUE!", message: 'reading the date in text "15 March" depends on the computer\'s locale; not computed headless' });
    expect(evaluateFormula('=HOUR("noon")')).toEqual({ error: "#VALUE!", message: 'reading the date in text "noon" depends on the computer\'s locale; not computed headless' });
  });
  it("DATEDIF's units MD and YD are refused (behaviour: Microsoft's DATEDIF page documents known problems with MD)", () => {
    expect(evaluateFormula('=DATEDIF(1,400,"MD")')).toEqual({ error: "#VALUE!", message: 'DATEDIF with unit "MD" is not computed headless (Microsoft documents known problems with "MD"; "YD" is not checked)' });
    expect(evaluateFormula('=DATEDIF(1,400,"YD")').message).toMatch(/^DATEDIF with unit "YD" is not computed headless/);
  });
  it("TODAY is the whole day of NOW, in the workbook's date system (MS TODAY/NOW: serial numbers of the current date and time)", async () => {
    const v = await compute({}, { H1: "NOW()-TODAY()", H2: "TODAY()" });
    const frac = v("H1") as number;
    expect(frac).toBeGreaterThanOrEqual(0);
    expect(frac).toBeLessThan(1);
    expect(Number.isInteger(v("H2"))).toBe(true);
    expect(v("H2") as number).toBeGreaterThan(45000); // after 15 March 2023
  });
});

describe("refused where Excel's reading is not known (found by scripts/oracle/differential.js)", () => {
  const neg = (name: string) => `${name} with a count between -1 and 0 is not computed headless (whether Excel truncates it to 0 or refuses it as negative is not checked; LibreOffice: #VALUE!)`;
  it("a count between -1 and 0 for LEFT, RIGHT, MID, REPT (LO 7.4 headless: #VALUE!; the engine truncated it to 0 and gave \"\")", () => {
    expect(evaluateFormula('=LEFT("abc",-0.5)')).toEqual({ error: "#VALUE!", message: neg("LEFT") });
    expect(evaluateFormula('=RIGHT("abc",-0.25)')).toEqual({ error: "#VALUE!", message: neg("RIGHT") });
    expect(evaluateFormula('=MID("abc",1,-0.5)')).toEqual({ error: "#VALUE!", message: neg("MID") });
    expect(evaluateFormula('=REPT("x",-0.25)')).toEqual({ error: "#VALUE!", message: neg("REPT") });
    expect(evaluateFormula('=LEFT("abc",0.5)')).toEqual({ value: "" }); // LO
    expect(evaluateFormula('=LEFT("abc",-1)')).toEqual({ error: "#VALUE!", message: "LEFT of a negative count" }); // LO: #VALUE!
  });
  it("HOUR and MINUTE less than a second before a full minute (LO 7.4 headless truncates: HOUR(0.999999) is 23, MINUTE(TIME(10,59,59)+0.7/86400) is 59; the engine rounded to the second: 0 and 0)", () => {
    const msg = (name: string) => `${name} of a time less than a second before a full minute is not computed headless (rounded to the second it is the next minute; whether Excel rounds or truncates here is not checked)`;
    expect(evaluateFormula("=HOUR(0.999999)")).toEqual({ error: "#VALUE!", message: msg("HOUR") });
    expect(evaluateFormula("=MINUTE(TIME(10,59,59)+0.7/86400)")).toEqual({ error: "#VALUE!", message: msg("MINUTE") });
    expect(evaluateFormula("=SECOND(0.999999)")).toEqual({ value: 0 }); // LO
    expect(evaluateFormula("=MINUTE(TIME(6,45,0))")).toEqual({ value: 45 }); // LO
    expect(evaluateFormula("=HOUR(TIME(10,59,59)+0.3/86400)")).toEqual({ value: 10 }); // LO
  });
});

describe("TIME with a negative fraction (found by scripts/oracle/differential.js)", () => {
  it("is refused: truncated toward 0 TIME(0,0,-0.5) is 0, floored it is #NUM!; LO 7.4 headless gives #VALUE! and Excel's rule is not established (the engine gave 0). Whole negatives and positive fractions are kept", () => {
    for (const f of ["TIME(0,0,-0.5)", "TIME(1,-0.5,0)", "TIME(-0.1,30,0)"]) {
      expect(evaluateFormula(`=${f}`)).toEqual({ error: "#VALUE!", message: expect.stringContaining("TIME with a negative fraction") });
    }
    expect(evaluateFormula("=TIME(1,-30,0)")).toEqual({ value: 0.020833333333333332 });
    expect(evaluateFormula("=TIME(12.9,0,0)")).toEqual({ value: 0.5 });
  });
});
