import { Document, Page, StyleSheet, Text, View, renderToBuffer } from "@react-pdf/renderer";
import { PDF_FONT_FAMILY, pdfText, registerFonts } from "@/lib/quoting/quote-pdf-layout";
import type { LabelledValue } from "@/lib/vocabulary";
import type { CertificateDocument, TravelerDocument } from "./order-document";

/**
 * The order's two PDFs (@react-pdf/renderer, the app's shipped fonts): the build traveler that goes
 * with the bank through the floor, and the test certificate the customer downloads. Layout only:
 * the words come from order-document.ts, the records from the loader.
 */

const ink = "#1f2933";
const muted = "#52606d";
const rule = "#d9e2ec";
const copper = "#b4632b";
const pass = "#0f766e";
const fail = "#b91c1c";

const s = StyleSheet.create({
  page: { fontFamily: PDF_FONT_FAMILY, fontSize: 9, color: ink, paddingTop: 36, paddingBottom: 48, paddingHorizontal: 40, lineHeight: 1.35 },
  header: { flexDirection: "row", justifyContent: "space-between", borderBottomWidth: 2, borderBottomColor: copper, paddingBottom: 8, marginBottom: 10 },
  shop: { fontSize: 14, fontWeight: 600, lineHeight: 1.2, marginBottom: 3 },
  title: { fontSize: 12, fontWeight: 600, textAlign: "right" },
  h2: { fontSize: 10.5, fontWeight: 600, marginTop: 12, marginBottom: 4 },
  kvRow: { flexDirection: "row", borderBottomWidth: 0.5, borderBottomColor: rule, paddingVertical: 2 },
  kvLabel: { width: "38%", color: muted, paddingRight: 4 },
  kvValue: { width: "62%" },
  row: { flexDirection: "row", borderBottomWidth: 0.5, borderBottomColor: rule, paddingVertical: 2 },
  head: { flexDirection: "row", borderBottomWidth: 1, borderBottomColor: ink, paddingBottom: 2, fontWeight: 500 },
  box: { borderWidth: 1, borderColor: "#c2410c", padding: 6, marginTop: 4 },
  bullet: { marginBottom: 2 },
  sign: { flexDirection: "row", gap: 16, marginTop: 14 },
  signLine: { flex: 1, borderTopWidth: 0.75, borderTopColor: ink, paddingTop: 2, color: muted, fontSize: 8 },
  footer: { position: "absolute", bottom: 24, left: 40, right: 40, flexDirection: "row", justifyContent: "space-between", color: muted, fontSize: 7.5 },
});

function KeyValues({ rows }: { rows: LabelledValue[] }) {
  return (
    <View>
      {rows.map((r) => (
        <View key={r.label} style={s.kvRow} wrap={false}>
          <Text style={s.kvLabel}>{pdfText(r.label)}</Text>
          <Text style={s.kvValue}>{pdfText(r.value)}</Text>
        </View>
      ))}
    </View>
  );
}

function Bullets({ items }: { items: string[] }) {
  return (
    <View>
      {items.map((t) => (
        <Text key={t} style={s.bullet}>
          • {pdfText(t)}
        </Text>
      ))}
    </View>
  );
}

function Header({ shopName, kind, title }: { shopName: string; kind: string; title: string }) {
  return (
    <View style={s.header} fixed>
      <View>
        <Text style={s.shop}>{pdfText(shopName)}</Text>
        <Text style={{ color: muted }}>{kind}</Text>
      </View>
      <Text style={s.title}>{title}</Text>
    </View>
  );
}

function Footer({ left }: { left: string }) {
  return (
    <View style={s.footer} fixed>
      <Text>{pdfText(left)}</Text>
      <Text render={({ pageNumber, totalPages }) => `Page ${pageNumber} of ${totalPages}`} />
    </View>
  );
}

function Safety({ items }: { items: string[] }) {
  return (
    <View wrap={false}>
      <Text style={s.h2}>Safety</Text>
      <View style={s.box}>
        <Bullets items={items} />
      </View>
    </View>
  );
}

export function TravelerPdf({ doc, shopName }: { doc: TravelerDocument; shopName: string }) {
  return (
    <Document title={doc.title} author={shopName} creator="Faradsmith" producer="Faradsmith">
      <Page size="A4" style={s.page}>
        <Header shopName={shopName} kind="Build traveler" title={doc.title} />
        <KeyValues rows={doc.header} />
        <Safety items={doc.safety} />
        <Text style={s.h2}>The bank</Text>
        <KeyValues rows={doc.arrangement} />
        <Text style={s.h2}>Cell positions</Text>
        <Text style={{ color: muted, marginBottom: 3 }}>{pdfText(doc.positionsIntro)}</Text>
        <View style={s.head}>
          <Text style={{ width: "12%" }}>Position</Text>
          <Text style={{ width: "50%" }}>Cells</Text>
          <Text style={{ width: "38%" }}>Balancing</Text>
        </View>
        {doc.positions.map((p, i) =>
          "gap" in p ? (
            <View key={`gap-${i}`} style={s.row} wrap={false}>
              <Text style={{ color: muted }}>… {p.gap} more positions numbered the same way …</Text>
            </View>
          ) : (
            <View key={p.position} style={s.row} wrap={false}>
              <Text style={{ width: "12%" }}>{p.position}</Text>
              <Text style={{ width: "50%" }}>{p.cells}</Text>
              <Text style={{ width: "38%" }}>{pdfText(p.balancing)}</Text>
            </View>
          ),
        )}
        <Text style={s.h2}>Balancing and discharge</Text>
        <KeyValues rows={doc.resistors} />
        <Text style={s.h2}>Assembly notes</Text>
        <Bullets items={doc.assembly} />
        <View wrap={false}>
          <Text style={s.h2}>Acceptance test of each bank</Text>
          <View style={s.head}>
            <Text style={{ width: "60%" }}>Step</Text>
            <Text style={{ width: "28%" }}>Limit</Text>
            <Text style={{ width: "12%" }}>Result</Text>
          </View>
          {doc.tests.map((t) => (
            <View key={t.step} style={s.row}>
              <Text style={{ width: "60%" }}>{pdfText(t.step)}</Text>
              <Text style={{ width: "28%" }}>{pdfText(t.limit)}</Text>
              <Text style={{ width: "12%", color: muted }}>______</Text>
            </View>
          ))}
        </View>
        <View style={s.sign} wrap={false}>
          {["Kitted by / date", "Assembled by / date", "Tested by / date", "Released by / date"].map((l) => (
            <Text key={l} style={s.signLine}>
              {l}
            </Text>
          ))}
        </View>
        <Footer left={`${doc.title} · record every bank's results in the desk`} />
      </Page>
    </Document>
  );
}

export function CertificatePdf({ doc, shopName }: { doc: CertificateDocument; shopName: string }) {
  return (
    <Document title={doc.title} author={shopName} creator="Faradsmith" producer="Faradsmith">
      <Page size="A4" style={s.page}>
        <Header shopName={shopName} kind="Test certificate" title={doc.title} />
        <KeyValues rows={doc.header} />
        <Text style={s.h2}>The bank as specified</Text>
        <KeyValues rows={doc.specification} />
        {doc.banks.map((b) => (
          <View key={b.bank} wrap={false}>
            <Text style={s.h2}>
              Bank {b.bank}: {b.passed ? "PASSED" : "FAILED"} · tested {b.testedOn} by {pdfText(b.testedBy)}
            </Text>
            <View style={s.head}>
              <Text style={{ width: "30%" }}>Check</Text>
              <Text style={{ width: "32%" }}>Measured</Text>
              <Text style={{ width: "28%" }}>Limit</Text>
              <Text style={{ width: "10%" }}>Result</Text>
            </View>
            {b.checks.map((c) => (
              <View key={c.key} style={s.row}>
                <Text style={{ width: "30%" }}>{c.label}</Text>
                <Text style={{ width: "32%" }}>{pdfText(c.measured)}</Text>
                <Text style={{ width: "28%" }}>{pdfText(c.limit)}</Text>
                <Text style={{ width: "10%", color: c.passed ? pass : fail, fontWeight: 600 }}>{c.passed ? "pass" : "fail"}</Text>
              </View>
            ))}
          </View>
        ))}
        <Text style={s.h2}>How the limits were set</Text>
        <Bullets items={doc.basis} />
        <Safety items={doc.safety} />
        <Footer left={`${doc.title} · limits derived from the quote's frozen specification`} />
      </Page>
    </Document>
  );
}

export async function renderTravelerPdf(doc: TravelerDocument, shopName: string): Promise<Buffer> {
  registerFonts();
  return renderToBuffer(<TravelerPdf doc={doc} shopName={shopName} />);
}

export async function renderCertificatePdf(doc: CertificateDocument, shopName: string): Promise<Buffer> {
  registerFonts();
  return renderToBuffer(<CertificatePdf doc={doc} shopName={shopName} />);
}
