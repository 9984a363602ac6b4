/**
 * Text for the PDF fonts. The Latin and Greek files of the face are both registered (Ω comes from
 * the Greek one); the Ohm sign U+2126 is in neither, so it is printed as the Greek capital omega
 * U+03A9, which Unicode treats as its canonical equivalent.
 */
export function pdfText(s: string): string {
  return s.replace(/\u2126/g, "\u03a9");
}
