"use client";

import { useMemo } from "react";
import type uPlot from "uplot";
import { Notice } from "@/components/ui/notice";
import { UplotChart } from "@/components/runs/results/uplot-chart";
import { Cell, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
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
      <Table>
        <TableHead>
          <HeaderCell>Time (s)</HeaderCell>
          <HeaderCell>Voltage (V)</HeaderCell>
          <HeaderCell>Current (A)</HeaderCell>
          {c.temperatureC && <HeaderCell>Temperature (°C)</HeaderCell>}
        </TableHead>
        <tbody>
          {Array.from({ length: shown }, (_, k) => (
            <Row key={k}>
              <Cell>{c.timeS[k]}</Cell>
              <Cell>{c.voltageV[k]}</Cell>
              <Cell>{c.currentA[k]}</Cell>
              {c.temperatureC && <Cell>{c.temperatureC[k]}</Cell>}
            </Row>
          ))}
        </tbody>
      </Table>
      {chart && <UplotChart options={chart.options} data={chart.data} label="Plot check of the first rows: voltage and current against time" />}
    </div>
  );
}
