/** The native functions the headless engine computes, in one table (each is checked against LibreOffice in tests/engine). */
import { NativeFunction, setNativeFunctions } from "../evaluate";
import { addLogic } from "./logic";
import { addLookup } from "./lookup";
import { addMath } from "./math";
import { addText } from "./text";

function build(): Map<string, NativeFunction> {
  const t = new Map<string, NativeFunction>();
  addMath(t);
  addLogic(t);
  addLookup(t);
  addText(t);
  return t;
}

export const NATIVE_FUNCTIONS: ReadonlyMap<string, NativeFunction> = build();
setNativeFunctions(NATIVE_FUNCTIONS);
