/** The identity of an option: what the customer chooses and the server finds again. */
export function optionId(o: { cell: { sku: string }; topology: string; seriesCount: number; parallelCount: number }): string {
  return `${o.cell.sku}|${o.topology}|${o.seriesCount}|${o.parallelCount}`;
}
