/** Types for lo.js (LibreOffice headless with the oracle's private profile). */
export function findLibreOffice(): string | undefined;
export function libreOfficeVersion(bin?: string): string | undefined;
export function makeProfile(dir?: string): string;
export function convertAll(
  inputs: string[],
  outDir: string,
  options?: { bin?: string; profile?: string; format?: string; timeoutMs?: number; allowMissing?: boolean },
): string[];
