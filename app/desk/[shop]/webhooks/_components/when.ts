/** A moment as the desk's logs show it: "2026-08-14 09:30 UTC", or a dash. */
export function when(d: Date | null): string {
  return d ? `${d.toISOString().slice(0, 16).replace("T", " ")} UTC` : "—";
}
