// Types for the parts of scripts/services.mjs that TypeScript code (the tests) imports.
export function restartPostgres(dir: string): Promise<void>;
