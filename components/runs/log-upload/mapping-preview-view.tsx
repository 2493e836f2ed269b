"use client";

import { useMemo } from "react";
import type uPlot from "uplot";
import { Notice } from "@/components/ui/notice";
import { UplotChart } from "@/components/runs/results/uplot-chart";
import { Row, TableHead } from "@/components/ui/table";
import type { MappingPreview } from "./read-mapping-preview";

const SHOWN_ROWS = 8;

/** The first rows as the mapping reads them (SI units, charging positive) and their plot. */
export function MappingPreviewView({ preview }: { preview: MappingPreview }) {
  const chart = useMemo(() => {
    if (!preview.ok) return null;
    const c = preview.columns;
    const n = c.length;
    const options: Omit<uPlot.Options, "width"> = {
      height: 200,
      scales: { x: { time: false } },
      axes: [{ label: "Time (s)" }, { label: "Voltage (V)", scale: "V" }, { label: "Current (A)", scale: "A", side: 1, grid: { show: false } }],
      series: [{ label: "Time (s)" }, { label: "Voltage (V)", scale: "V", stroke: "#1f4e8c" }, { label: "Current (A)", scale: "A", stroke: "#b87333" }],
    };
    return { options, data: [Array.from(c.timeS.subarray(0, n)), Array.from(c.voltageV.subarray(0, n)), Array.from(c.currentA.subarray(0, n))] as uPlot.AlignedData };
  }, [preview]);
  if (!preview.ok) {
    return (
      <Notice tone="problem" role="alert" title="With this mapping the start of the file cannot be read">
        {preview.error.message}
      </Notice>
    );
  }
  const c = preview.columns;
  const shown = Math.min(SHOWN_ROWS, c.length);
  return (
    <div className="flex flex-col gap-3" data-testid="mapping-preview">
      <p className="text-sm">
        The first {preview.rows.toLocaleString("en-GB")} rows read with this mapping (first {shown} shown; current positive while charging):
      </p>
      <table className="text-sm">
        <TableHead>
          <th className="px-2">Time (s)</th>
          <th className="px-2">Voltage (V)</th>
          <th className="px-2">Current (A)</th>
          {c.temperatureC && <th className="px-2">Temperature (°C)</th>}
        </TableHead>
        <tbody>
          {Array.from({ length: shown }, (_, k) => (
            <Row key={k}>
              <td className="px-2">{c.timeS[k]}</td>
              <td className="px-2">{c.voltageV[k]}</td>
              <td className="px-2">{c.currentA[k]}</td>
              {c.temperatureC && <td className="px-2">{c.temperatureC[k]}</td>}
            </Row>
          ))}
        </tbody>
      </table>
      {chart && <UplotChart options={chart.options} data={chart.data} label="Plot check of the first rows: voltage and current against time" />}
    </div>
  );
}
