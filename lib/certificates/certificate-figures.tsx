import { Line, Path, Polyline, Rect, Svg, View } from "@react-pdf/renderer";
import { formatFigure } from "./certificate-format";
import { copper, ink, inkSoft, outcomeColour, rule, Tx } from "./certificate-primitives";
import type { QrModules } from "./qr-modules";
import { layOutVqPlot, type DischargeCurve } from "./vq-plot";

const PLOT = { width: 300, height: 112, left: 34, bottom: 26, top: 14, right: 10 };

/** Voltage against the charge delivered, vector lines with labelled axes and units. */
export function VqPlot({ curve, figure }: { curve: DischargeCurve; figure: number }) {
  const layout = layOutVqPlot(curve, PLOT.width, PLOT.height);
  const outerWidth = PLOT.left + PLOT.width + PLOT.right;
  const outerHeight = PLOT.top + PLOT.height + PLOT.bottom;
  const yDecimals = layout.yTicks.length > 1 && (layout.yTicks[1]?.value ?? 0) - (layout.yTicks[0]?.value ?? 0) < 0.1 ? 2 : 1;
  return (
    <View wrap={false} style={{ marginTop: 6, marginBottom: 4 }}>
      <View style={{ position: "relative", width: outerWidth, height: outerHeight }}>
        <Svg width={outerWidth} height={outerHeight} viewBox={`0 0 ${outerWidth} ${outerHeight}`}>
          {layout.yTicks.map((t) => (
            <Line key={`y${t.value}`} x1={PLOT.left} x2={PLOT.left + PLOT.width} y1={PLOT.top + t.at} y2={PLOT.top + t.at} stroke={rule} strokeWidth={0.4} />
          ))}
          {layout.xTicks.map((t) => (
            <Line key={`x${t.value}`} x1={PLOT.left + t.at} x2={PLOT.left + t.at} y1={PLOT.top} y2={PLOT.top + PLOT.height} stroke={rule} strokeWidth={0.4} />
          ))}
          <Line x1={PLOT.left} x2={PLOT.left} y1={PLOT.top} y2={PLOT.top + PLOT.height} stroke={ink} strokeWidth={0.7} />
          <Line x1={PLOT.left} x2={PLOT.left + PLOT.width} y1={PLOT.top + PLOT.height} y2={PLOT.top + PLOT.height} stroke={ink} strokeWidth={0.7} />
          <Polyline
            points={layout.points
              .split(" ")
              .filter(Boolean)
              .map((p) => {
                const [x, y] = p.split(",").map(Number);
                return `${((x ?? 0) + PLOT.left).toFixed(2)},${((y ?? 0) + PLOT.top).toFixed(2)}`;
              })
              .join(" ")}
            stroke={ink}
            strokeWidth={1}
            fill="none"
          />
        </Svg>
        {layout.yTicks.map((t) => (
          <Tx key={`yl${t.value}`} style={{ position: "absolute", left: 0, width: PLOT.left - 4, top: PLOT.top + t.at - 4.5, fontSize: 6.5, textAlign: "right", color: inkSoft }}>
            {formatFigure(t.value, yDecimals)}
          </Tx>
        ))}
        {layout.xTicks.map((t) => (
          <Tx key={`xl${t.value}`} style={{ position: "absolute", left: PLOT.left + t.at - 20, width: 40, top: PLOT.top + PLOT.height + 3, fontSize: 6.5, textAlign: "center", color: inkSoft }}>
            {formatFigure(t.value, 0)}
          </Tx>
        ))}
        <Tx style={{ position: "absolute", left: PLOT.left, width: PLOT.width, top: PLOT.top + PLOT.height + 13, fontSize: 7, textAlign: "center" }}>Charge delivered (mAh)</Tx>
        <Tx style={{ position: "absolute", left: 0, top: 0, fontSize: 7 }}>Voltage (V)</Tx>
      </View>
      <Tx style={{ fontSize: 7.5, color: inkSoft, marginTop: 2 }}>{`Figure ${figure}: ${curve.label}, voltage against charge delivered (${curve.capacityMAh.length} points of the stored log).`}</Tx>
    </View>
  );
}

/** The QR code as vector rectangles, one per run of dark modules, with a four-module quiet zone. */
export function QrCode({ modules, size }: { modules: QrModules; size: number }) {
  const total = modules.size + 8;
  return (
    <Svg width={size} height={size} viewBox={`0 0 ${total} ${total}`}>
      <Rect x={0} y={0} width={total} height={total} fill="#ffffff" />
      {modules.runs.map((r) => (
        <Rect key={`${r.row}-${r.column}`} x={r.column + 4} y={r.row + 4} width={r.length} height={1.02} fill={ink} />
      ))}
    </Svg>
  );
}

export type OutcomeTone = keyof typeof outcomeColour;

/** A small drawn mark beside an outcome word: a tick, a cross or a question. Support only; the word says it. */
export function OutcomeMark({ tone, size = 9 }: { tone: OutcomeTone; size?: number }) {
  const colour = outcomeColour[tone];
  const d = tone === "meets" ? "M2 5.2 L4.2 7.4 L8 2.6" : tone === "deviates" ? "M2.5 2.5 L7.5 7.5 M7.5 2.5 L2.5 7.5" : "M3.4 3.6 C3.4 1.6 6.6 1.6 6.6 3.6 C6.6 5 5 5 5 6.4 M5 8.2 L5 8.4";
  return (
    <Svg width={size} height={size} viewBox="0 0 10 10">
      <Path d={d} stroke={colour} strokeWidth={1.5} fill="none" strokeLinecap="round" strokeLinejoin="round" />
    </Svg>
  );
}

/** The single copper rule under the page heading. */
export function CopperRule() {
  return <View style={{ height: 1.2, backgroundColor: copper, marginTop: 4 }} />;
}
