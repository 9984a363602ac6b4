import { Line, Rect, StyleSheet, Svg, Text, View } from "@react-pdf/renderer";
import { formatQuantity } from "@/lib/quantities";
import { KeyValues, PDF_COLORS } from "./pdf-parts";
import { pdfText } from "./pdf-text";
import type { QuoteEngineering } from "./quote-engineering";

/**
 * The quote PDF's engineering sections, from the same worded sections as the quote page
 * (quote-engineering.ts): one failed cell, tolerance yield with its histogram, temperature and
 * life, limits, handling and shipping.
 */

const { ink, muted } = PDF_COLORS;
const charge = "#1f9e8c";
const hazard = "#d99a06";
const danger = "#d23c32";

const styles = StyleSheet.create({
  h2: { fontSize: 10.5, fontWeight: 600, marginTop: 12, marginBottom: 4 },
  h3: { fontSize: 9.5, fontWeight: 600, marginTop: 6, marginBottom: 2 },
  line: { marginBottom: 2 },
  small: { fontSize: 7.5, color: muted, marginBottom: 1 },
  columns: { flexDirection: "row", gap: 16 },
  column: { flex: 1 },
  axis: { flexDirection: "row", justifyContent: "space-between", fontSize: 7.5, color: muted },
});

/** A list of notes in small print. */
function Notes({ items }: { items: string[] }) {
  return (
    <>
      {items.map((a) => (
        <Text key={a} style={styles.small}>
          • {pdfText(a)}
        </Text>
      ))}
    </>
  );
}

const HW = 240;
const HH = 70;

function Histogram({ t }: { t: NonNullable<QuoteEngineering["tolerance"]> }) {
  const first = t.histogram[0];
  const last = t.histogram.at(-1);
  if (!first || !last) return null;
  const lo = first.from;
  const hi = last.to > lo ? last.to : lo + 1;
  const top = Math.max(...t.histogram.map((b) => b.count), 1);
  const x = (v: number) => ((v - lo) / (hi - lo)) * HW;
  return (
    <View style={{ marginVertical: 4 }}>
      <Svg width={HW} height={HH}>
        {t.histogram.map((b, i) => {
          const h = (b.count / top) * (HH - 4);
          return (
            <Rect
              key={i}
              x={x(b.from)}
              y={HH - h}
              width={Math.max(0.5, x(b.to) - x(b.from) - 0.6)}
              height={h}
              fill={t.required !== null && b.to <= t.required ? hazard : charge}
            />
          );
        })}
        {t.required !== null && t.required >= lo && t.required <= hi ? (
          <Line x1={x(t.required)} x2={x(t.required)} y1={0} y2={HH} strokeWidth={1} stroke={danger} strokeDasharray="3 2" />
        ) : null}
        <Line x1={0} x2={HW} y1={HH} y2={HH} strokeWidth={0.5} stroke={ink} />
      </Svg>
      <View style={[styles.axis, { width: HW }]}>
        <Text>{formatQuantity(lo, "F")}</Text>
        <Text>capacitance of {t.samples.toLocaleString("en-GB")} sampled banks</Text>
        <Text>{formatQuantity(hi, "F")}</Text>
      </View>
    </View>
  );
}

export function QuotePdfEngineering({ e }: { e: QuoteEngineering }) {
  return (
    <View>
      <View wrap={false}>
        <Text style={styles.h2}>How the bank fails and how long it lasts</Text>
        <Text style={styles.h3}>One failed cell</Text>
        {e.failures ? (
          <>
            <Text style={styles.line}>{pdfText(e.failures.short)}</Text>
            <Text style={styles.line}>{pdfText(e.failures.open)}</Text>
          </>
        ) : (
          <Text style={styles.line}>One-cell failures: {e.absent}.</Text>
        )}
        <Text style={styles.small}>At the working voltage by ideal capacitive division, without balancing, matched cells at their worst.</Text>
      </View>
      <View wrap={false}>
        <Text style={styles.h3}>Tolerance yield</Text>
        {e.tolerance ? (
          <View style={styles.columns}>
            <View style={styles.column}>
              <Text style={styles.line}>{pdfText(e.tolerance.headline)}</Text>
              <Histogram t={e.tolerance} />
            </View>
            <View style={styles.column}>
              <KeyValues rows={e.tolerance.rows} />
            </View>
          </View>
        ) : (
          <Text style={styles.line}>Tolerance yield: {e.absent}.</Text>
        )}
      </View>
      <View wrap={false}>
        <Text style={styles.h3}>Temperature and expected life</Text>
        {e.life ? (
          <View style={styles.columns}>
            <View style={styles.column}>
              <KeyValues rows={e.life.rows} />
            </View>
            <View style={styles.column}>
              <Notes items={e.life.assumptions} />
            </View>
          </View>
        ) : (
          <Text style={styles.line}>Expected life: {e.lifeNote}.</Text>
        )}
      </View>
      <View wrap={false}>
        <Text style={styles.h3}>Limits, handling and shipping</Text>
        <View style={styles.columns}>
          <View style={styles.column}>
            <KeyValues rows={e.handling.rows} />
          </View>
          <View style={styles.column}>
            <Notes items={e.handling.shipping} />
          </View>
        </View>
      </View>
    </View>
  );
}
