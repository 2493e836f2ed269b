import { StyleSheet, Text, View, type Styles } from "@react-pdf/renderer";
import type { ReactNode } from "react";
import { palette } from "@/tailwind.config";
import { toCertificateText } from "./certificate-text";

/** The certificate's colours: the workbench palette on white paper, copper for the one accent line. */
export const ink = palette.ink;
export const inkSoft = palette["ink-soft"];
export const rule = palette.rule;
export const copper = palette.copper;
export const outcomeColour = { meets: palette.meets, deviates: palette.deviates, open: palette.unassessed } as const;

/** Merriweather with its Latin Extended subset as the fallback family (certificate-fonts.ts). */
export const FONT = ["Merriweather", "MerriweatherExt"];

export const styles = StyleSheet.create({
  page: { fontFamily: FONT, fontSize: 8.5, lineHeight: 1.35, color: ink, backgroundColor: "#ffffff", paddingTop: 62, paddingBottom: 48, paddingHorizontal: 48 },
  heading: { fontFamily: FONT, fontWeight: 700, fontSize: 10.5, marginTop: 10, marginBottom: 3 },
  small: { fontSize: 7.5, color: inkSoft },
  label: { color: inkSoft },
  strong: { fontWeight: 700 },
  figure: { fontFeatureSettings: ["tnum"] },
  cell: { paddingVertical: 2, paddingHorizontal: 3, fontSize: 7.5, fontFeatureSettings: ["tnum"] },
  headCell: { paddingVertical: 2, paddingHorizontal: 3, fontSize: 7, fontWeight: 700, color: inkSoft },
  row: { flexDirection: "row", borderBottomWidth: 0.5, borderBottomColor: rule },
  headRow: { flexDirection: "row", borderBottomWidth: 0.8, borderBottomColor: ink },
  hash: { fontFamily: "Courier", fontSize: 7 },
});

/** Children that are text go through toCertificateText, so nothing reaches the PDF that the font cannot draw. */
function clean(children: ReactNode): ReactNode {
  if (typeof children === "string") return toCertificateText(children);
  if (typeof children === "number") return String(children);
  if (Array.isArray(children)) return children.map((child: ReactNode) => clean(child));
  return children;
}

type PdfStyle = Styles[string];
type TextStyle = PdfStyle | PdfStyle[];

export function Tx({ style, children, fixed }: { style?: TextStyle; children: ReactNode; fixed?: boolean }) {
  return (
    <Text style={style} fixed={fixed}>
      {clean(children)}
    </Text>
  );
}

/** A label and its value on one line of a two-column list. */
export function Field({ label, children, labelWidth = 120 }: { label: string; children: ReactNode; labelWidth?: number }) {
  return (
    <View style={{ flexDirection: "row", marginBottom: 1.5 }} wrap={false}>
      <Tx style={{ width: labelWidth, color: inkSoft }}>{label}</Tx>
      <View style={{ flex: 1 }}>{typeof children === "string" || typeof children === "number" ? <Tx>{children}</Tx> : children}</View>
    </View>
  );
}

export interface Column {
  title: string;
  /** Share of the row, in percent. */
  width: number;
  align?: "left" | "right";
}

/** A dense table: a header rule in ink, hair rules between rows, rows never split across pages. `lead` (a heading) stays with the header and the first row. */
export function Table({ columns, rows, lead }: { columns: Column[]; rows: ReactNode[][]; lead?: ReactNode }) {
  const renderRow = (cells: ReactNode[], r: number) => (
    <View key={r} style={styles.row} wrap={false}>
      {cells.map((cell, k) => (
        <View key={k} style={{ width: `${columns[k]?.width ?? 10}%` }}>
          {typeof cell === "string" || typeof cell === "number" ? <Tx style={[styles.cell, { textAlign: columns[k]?.align ?? "left" }]}>{cell}</Tx> : cell}
        </View>
      ))}
    </View>
  );
  return (
    <View>
      <View wrap={false}>
        {lead}
        <View style={styles.headRow}>
          {columns.map((c) => (
            <Tx key={c.title} style={[styles.headCell, { width: `${c.width}%`, textAlign: c.align ?? "left" }]}>
              {c.title}
            </Tx>
          ))}
        </View>
        {rows.slice(0, 1).map(renderRow)}
      </View>
      {rows.slice(1).map((cells, r) => renderRow(cells, r + 1))}
    </View>
  );
}

/** A numbered section heading; callers keep it on one page with what follows it (wrap={false} or a table's lead). */
export function Heading({ number, children }: { number: number; children: string }) {
  return (
    <Tx style={styles.heading}>
      {`${number}  ${children}`}
    </Tx>
  );
}
