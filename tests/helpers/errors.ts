/** Test helpers for core errors: the code (or message) a call throws, undefined/"" if it does not. No values here: the source of each check is named in the test that uses them. */
import { SoilError, SoilErrorCode } from "../../src/core/errors";

export function errorCode(f: () => unknown): SoilErrorCode | undefined {
  try {
    f();
  } catch (e) {
    if (e instanceof SoilError) return e.code;
    throw e;
  }
  return undefined;
}

export function errorMessage(f: () => unknown): string {
  try {
    f();
  } catch (e) {
    return (e as Error).message;
  }
  return "";
}
