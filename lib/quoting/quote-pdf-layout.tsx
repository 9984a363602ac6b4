import path from "node:path";
import { Document, Font, Page, StyleSheet, Text, View, renderToBuffer } from "@react-pdf/renderer";
import { KeyValues } from "./pdf-parts";
import { pdfText } from "./pdf-text";
import type { QuoteDocument } from "./quote-document";
import { QuotePdfEngineering } from "./quote-pdf-engineering";

/**
 * The PDF layout: the quote as a PDF (@react-pdf/renderer), from the same worded document the quote
 * page shows (quote-document.ts). No database here, so it renders in tests and benchmarks from a
 * document in memory; quote-pdf-loader.ts reads a revision and renders it with this.
 */

const FAMILY = "IBM Plex Sans";
/** The same face's Greek subset, for Ω and µ-like signs the Latin files lack: the renderer falls back to it per glyph. */
const GREEK = "IBM Plex Sans Greek";
/** Every PDF page's font: Latin first, then Greek. */
export const PDF_FONT_FAMILY = [FAMILY, GREEK];
let fontsRegistered = false;

export function registerFonts() {
  if (fontsRegistered) return;
  const dir = path.join(process.cwd(), "app", "fonts");
  // the three weights the layout uses, from the Latin files and the Greek ones
  const weights = (file: string) => [400, 500, 600].map((w) => ({ src: path.join(dir, `${file}-${w}.woff`), fontWeight: w }));
  Font.register({ family: FAMILY, fonts: weights("plex-sans") });
  Font.register({ family: GREEK, fonts: weights("plex-sans-greek") });
  // part numbers and figures must never be split across lines with a hyphen
  Font.registerHyphenationCallback((word) => [word]);
  fontsRegistered = true;
}

export { pdfText };

const ink = "#1f2933";
const muted = "#52606d";
const rule = "#d9e2ec";
const copper = "#b4632b";

const styles = StyleSheet.create({
  page: { fontFamily: PDF_FONT_FAMILY, fontSize: 9, color: ink, paddingTop: 36, paddingBottom: 48, paddingHorizontal: 40, lineHeight: 1.35 },
  header: { flexDirection: "row", justifyContent: "space-between", borderBottomWidth: 2, borderBottomColor: copper, paddingBottom: 8, marginBottom: 12 },
  shop: { fontSize: 14, fontWeight: 600, lineHeight: 1.2, marginBottom: 3 },
  title: { fontSize: 12, fontWeight: 600, textAlign: "right", lineHeight: 1.2, marginBottom: 3 },
  meta: { color: muted, textAlign: "right", marginTop: 1 },
  h2: { fontSize: 10.5, fontWeight: 600, marginTop: 12, marginBottom: 4 },
  columns: { flexDirection: "row", gap: 16 },
  column: { flex: 1 },
  tableHead: { flexDirection: "row", borderBottomWidth: 1, borderBottomColor: ink, paddingBottom: 2, fontWeight: 500 },
  tableRow: { flexDirection: "row", borderBottomWidth: 0.5, borderBottomColor: rule, paddingVertical: 2 },
  cDesc: { width: "50%", paddingRight: 6 },
  cQty: { width: "8%", textAlign: "right" },
  cUnit: { width: "10%", paddingLeft: 4 },
  cPrice: { width: "16%", textAlign: "right" },
  cAmount: { width: "16%", textAlign: "right" },
  totals: { marginTop: 6, marginLeft: "50%" },
  totalRow: { flexDirection: "row", justifyContent: "space-between", paddingVertical: 1.5 },
  grandTotal: {
    flexDirection: "row",
    justifyContent: "space-between",
    borderTopWidth: 1,
    borderTopColor: ink,
    marginTop: 2,
    paddingTop: 3,
    fontSize: 11,
    fontWeight: 600,
  },
  caution: { marginBottom: 2 },
  cautionBox: { borderWidth: 1, borderColor: "#c2410c", padding: 6, marginTop: 4 },
  footer: { position: "absolute", bottom: 24, left: 40, right: 40, flexDirection: "row", justifyContent: "space-between", color: muted, fontSize: 7.5 },
});

export function QuotePdfLayout({ doc }: { doc: QuoteDocument }) {
  const totals = doc.totals.slice(0, -1);
  return (
    <Document
      title={`Quote ${doc.number} revision ${doc.revision}`}
      author={doc.shopName}
      subject={`Quote ${doc.number}`}
      creator="Faradsmith"
      producer="Faradsmith"
    >
      <Page size="A4" style={styles.page}>
        <View style={styles.header} fixed>
          <View>
            <Text style={styles.shop}>{pdfText(doc.shopName)}</Text>
            <Text style={{ color: muted }}>Capacitor bank quote</Text>
          </View>
          <View>
            <Text style={styles.title}>
              Quote {doc.number} · revision {doc.revision}
            </Text>
            <Text style={styles.meta}>
              Issued {doc.issuedOn} · valid until {doc.validUntil}
            </Text>
            <Text style={styles.meta}>
              For {pdfText(doc.customerName)} ({doc.customerEmail})
            </Text>
          </View>
        </View>

        <View style={styles.columns}>
          <View style={styles.column}>
            <Text style={styles.h2}>Your requirement</Text>
            <KeyValues rows={doc.requirement} />
            <Text style={styles.h2}>Arrangement</Text>
            <KeyValues rows={doc.arrangement} />
          </View>
          <View style={styles.column}>
            <Text style={styles.h2}>Cell</Text>
            <KeyValues rows={doc.cell} />
          </View>
        </View>

        <Text style={styles.h2}>Bank figures</Text>
        <View style={styles.columns}>
          <View style={styles.column}>
            <KeyValues rows={doc.figures.slice(0, Math.ceil(doc.figures.length / 2))} />
          </View>
          <View style={styles.column}>
            <KeyValues rows={doc.figures.slice(Math.ceil(doc.figures.length / 2))} />
          </View>
        </View>

        <Text style={styles.h2}>Price</Text>
        <View style={styles.tableHead}>
          <Text style={styles.cDesc}>Item</Text>
          <Text style={styles.cQty}>Quantity</Text>
          <Text style={styles.cUnit}></Text>
          <Text style={styles.cPrice}>Unit price</Text>
          <Text style={styles.cAmount}>Amount</Text>
        </View>
        {doc.lines.map((l) => (
          <View key={l.position} style={styles.tableRow} wrap={false}>
            <Text style={styles.cDesc}>{pdfText(l.description)}</Text>
            <Text style={styles.cQty}>{l.quantity}</Text>
            <Text style={styles.cUnit}>{l.unit}</Text>
            <Text style={styles.cPrice}>{l.unitPrice}</Text>
            <Text style={styles.cAmount}>{l.amount}</Text>
          </View>
        ))}
        <View style={styles.totals} wrap={false}>
          {totals.map((t) => (
            <View key={t.label} style={styles.totalRow}>
              <Text>{t.label}</Text>
              <Text>{t.value}</Text>
            </View>
          ))}
          <View style={styles.grandTotal}>
            <Text>Total ({doc.currency})</Text>
            <Text>{doc.total}</Text>
          </View>
        </View>

        <QuotePdfEngineering e={doc.engineering} />

        <View wrap={false}>
          <Text style={styles.h2}>Safety</Text>
          <View style={styles.cautionBox}>
            {doc.cautions.map((c) => (
              <Text key={c} style={styles.caution}>
                • {pdfText(c)}
              </Text>
            ))}
          </View>
        </View>
        {doc.notes.length > 0 ? (
          <View wrap={false}>
            <Text style={styles.h2}>Notes</Text>
            {doc.notes.map((n) => (
              <Text key={n}>• {pdfText(n)}</Text>
            ))}
          </View>
        ) : null}

        <View style={styles.footer} fixed>
          <Text>
            {doc.number} r{doc.revision} · prices in {doc.currency} · valid until {doc.validUntil}
          </Text>
          <Text render={({ pageNumber, totalPages }) => `Page ${pageNumber} of ${totalPages}`} />
        </View>
      </Page>
    </Document>
  );
}

/** `Q-2026-0001-r1.pdf` */
export function quotePdfFileName(number: string, revision: number): string {
  return `${number}-r${revision}.pdf`;
}

/** Renders a worded quote to PDF bytes. */
export async function renderQuotePdfLayout(doc: QuoteDocument): Promise<Buffer> {
  registerFonts();
  return renderToBuffer(<QuotePdfLayout doc={doc} />);
}
