/**
 * Thrown, never returned, where the engine cannot compute something: it unwinds to the cell,
 * which becomes Uncomputable. Were it an error value, IFERROR, ISERROR or COUNT could swallow it
 * and give a number Excel would not (IFERROR(SEARCH(…),0) would read 0).
 */
export class NotComputed extends Error {
  constructor(message: string) {
    super(message);
    this.name = "NotComputed";
  }
}

export function notComputed(message: string): never {
  throw new NotComputed(message);
}
