// Types for scripts/http-client.mjs, for the TypeScript tests that use it.
export interface Answer {
  status: number;
  headers: Record<string, string | string[] | undefined>;
  text: string;
}
export interface OptionIdentity {
  cell: { sku: string };
  topology: string;
  seriesCount: number;
  parallelCount: number;
}
export type ActionAnswer = { ok: true; data: { kind: string; quoteNumber?: string; requestId?: string } } | { ok: false; code: string; message?: string };
export function serverActionIds(distDir: string): Record<string, string>;
export function send(
  base: string,
  method: string,
  pathname: string,
  options?: { headers?: Record<string, string>; body?: string; from?: string },
): Promise<Answer>;
export function signIn(base: string, email: string, password: string, from?: string): Promise<string>;
export function arrangements(
  base: string,
  shop: string,
  requirement: unknown,
  from?: string,
): Promise<{ status: number; body: { options: OptionIdentity[] } | null }>;
export function callAction(base: string, options: { page: string; actionId: string; args: unknown[]; cookie?: string; from?: string }): Promise<ActionAnswer>;
export function chooseCheapest(
  base: string,
  options: { shop: string; actionId: string; cookie: string; requirement: unknown; option: OptionIdentity; from?: string },
): Promise<ActionAnswer>;
export function percentile(sorted: number[], p: number): number;
export function gapFree(numbers: string[]): boolean;
