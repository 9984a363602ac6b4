import { StyleSheet, Text, View } from "@react-pdf/renderer";
import type { LabelledValue } from "@/lib/vocabulary";
import { pdfText } from "./pdf-text";

/** Pieces the quote PDF's sections share: labelled rows in the layout's colours. */

export const PDF_COLORS = { ink: "#1f2933", muted: "#52606d", rule: "#d9e2ec", copper: "#b4632b" } as const;

const styles = StyleSheet.create({
  kvRow: { flexDirection: "row", borderBottomWidth: 0.5, borderBottomColor: PDF_COLORS.rule, paddingVertical: 2 },
  kvLabel: { width: "58%", color: PDF_COLORS.muted, paddingRight: 4 },
  kvValue: { width: "42%" },
});

export function KeyValues({ rows }: { rows: LabelledValue[] }) {
  return (
    <View>
      {rows.map((r) => (
        <View key={r.label} style={styles.kvRow} wrap={false}>
          <Text style={styles.kvLabel}>{pdfText(r.label)}</Text>
          <Text style={styles.kvValue}>{pdfText(r.value)}</Text>
        </View>
      ))}
    </View>
  );
}
