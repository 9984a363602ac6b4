/** The shipped Latin subset has no Ω: print the unit's name instead. */
export function pdfText(s: string): string {
  return s.replace(/\u03a9|\u2126/g, "Ohm");
}
