/** HyperFormula configuration shared by every engine entry point. */
import { HyperFormula, ConfigParams } from "hyperformula";
import { registerSoilFunctions } from "./plugin";

/** HyperFormula is used under the GPL-3.0 (soilcell is GPL-3.0-or-later). */
export const HF_CONFIG: Partial<ConfigParams> = {
  licenseKey: "gpl-v3",
  useArrayArithmetic: false,
  useColumnIndex: false,
  smartRounding: false,
  precisionRounding: 0,
  precisionEpsilon: 0,
  // Excel's own limits, so a workbook Excel accepts is accepted here.
  maxRows: 1048576,
  maxColumns: 16384,
};

export function newEngine(sheets: Record<string, unknown[][]>): HyperFormula {
  registerSoilFunctions();
  return HyperFormula.buildFromSheets(sheets as never, HF_CONFIG);
}
