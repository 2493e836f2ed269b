import type { CellSpecification } from "../protocols";

/**
 * A one-page PDF listing an invented cell's values, so the demo library has datasheets to open.
 * Written by hand (PDF 1.4, ISO 32000-1 §7: header, objects, xref table with byte offsets, trailer);
 * Helvetica is one of the standard 14 fonts, so nothing is embedded.
 */
export function renderDemoDatasheet(maker: string, model: string, data: CellSpecification): Uint8Array {
  const lines = [
    `${maker} ${model}`,
    "Invented cell for the Cellwright demo: not a real product.",
    "",
    `Chemistry: ${data.chemistry.label}, ${data.shape}`,
    `Rated capacity: ${data.ratedCapacityMah} mAh`,
    `Nominal voltage: ${data.nominalVoltageV} V`,
    `Charge voltage: ${data.chargeVoltageV} V`,
    `Standard charge current: ${data.standardChargeCurrentA} A`,
    `Maximum continuous discharge current: ${data.maxContinuousDischargeCurrentA} A`,
    `End-of-discharge voltage: ${data.endOfDischargeVoltageV} V`,
    `Maximum height: ${data.maxHeightMm} mm`,
  ];
  const escape = (t: string) => t.replace(/[\\()]/g, (c) => `\\${c}`);
  const text = lines.map((l, i) => `BT /F1 ${i === 0 ? 16 : 11} Tf 56 ${780 - i * 20} Td (${escape(l)}) Tj ET`).join("\n");
  const objects = [
    "<< /Type /Catalog /Pages 2 0 R >>",
    "<< /Type /Pages /Kids [3 0 R] /Count 1 >>",
    "<< /Type /Page /Parent 2 0 R /MediaBox [0 0 595 842] /Resources << /Font << /F1 4 0 R >> >> /Contents 5 0 R >>",
    "<< /Type /Font /Subtype /Type1 /BaseFont /Helvetica >>",
    `<< /Length ${Buffer.byteLength(text, "latin1")} >>\nstream\n${text}\nendstream`,
  ];
  let body = "%PDF-1.4\n";
  const offsets: number[] = [];
  objects.forEach((o, i) => {
    offsets.push(Buffer.byteLength(body, "latin1"));
    body += `${i + 1} 0 obj\n${o}\nendobj\n`;
  });
  const xrefAt = Buffer.byteLength(body, "latin1");
  body += `xref\n0 ${objects.length + 1}\n0000000000 65535 f \n`;
  body += offsets.map((o) => `${String(o).padStart(10, "0")} 00000 n \n`).join("");
  body += `trailer\n<< /Size ${objects.length + 1} /Root 1 0 R >>\nstartxref\n${xrefAt}\n%%EOF\n`;
  return new Uint8Array(Buffer.from(body, "latin1"));
}
