import { readFileSync } from "node:fs";
import { join } from "node:path";
import { Document, Font, Page, renderToBuffer, Text, View } from "@react-pdf/renderer";
import { CopperRule, QrCode, VqPlot } from "./certificate-figures";
import { convertWoffToSfnt } from "./woff-to-sfnt";
import type { CertificatePayload, LotCertificatePayload, RunCertificatePayload, SignatureStatement } from "./certificate-payload";
import { ink, inkSoft, rule, styles, Tx } from "./certificate-primitives";
import {
  ConditionsSection,
  ConformitySection,
  DeviationsSection,
  EvidenceSection,
  InstrumentsSection,
  ItemSection,
  LabSection,
  MethodSection,
  ResultsSection,
  SignatureBlock,
  TitleBlock,
} from "./certificate-sections";
import { UncertaintySection } from "./certificate-uncertainty-section";
import { DrawSection, LotDecisionSection, LotItemSection, LotMethodSection, LotStatisticsSection, LotTitleBlock, SamplingPlanSection } from "./lot-certificate-sections";
import type { QrModules } from "./qr-modules";
import type { DischargeCurve } from "./vq-plot";

// This module is the one place that imports @react-pdf/renderer (0.3–0.5 s, docs/stack.md); it is loaded
// lazily by render-certificate.ts, once per process, and registers the fonts when it loads.
const FONT_DIR = join(process.cwd(), "node_modules", "@fontsource", "merriweather", "files");
/** A face as a data URL of the unpacked font (woff-to-sfnt.ts), read from the package once per process. */
function unpackedFace(subset: string, fontWeight: 400 | 700) {
  const sfnt = convertWoffToSfnt(readFileSync(join(FONT_DIR, `merriweather-${subset}-${fontWeight}-normal.woff`)));
  return { src: `data:font/ttf;base64,${sfnt.toString("base64")}`, fontWeight };
}
// Regular and bold only: the certificate sets no italic.
const faces = (subset: string) => [unpackedFace(subset, 400), unpackedFace(subset, 700)];
Font.register({ family: "Merriweather", fonts: faces("latin") });
Font.register({ family: "MerriweatherExt", fonts: faces("latin-ext") });
// Identifiers, hashes and units must print as written: no hyphen is ever added inside a word.
Font.registerHyphenationCallback((word) => [word]);

/** A4 height in points (ISO 216: 297 mm). */
const A4_HEIGHT = 841.89;

export interface CertificateDocumentInput {
  payload: CertificatePayload;
  payloadSha256: string;
  curves: DischargeCurve[];
  checkUrl: string;
  qr: QrModules;
  /** Common name of the lab's signing certificate, printed beside the digital signature note. */
  signingSubject: string;
}

function PageChrome({ payload }: { payload: CertificatePayload }) {
  return (
    <>
      <View fixed style={{ position: "absolute", top: 28, left: 48, right: 48 }}>
        <View style={{ flexDirection: "row", justifyContent: "space-between", alignItems: "flex-end" }}>
          <View>
            <Tx style={{ fontSize: 10, fontWeight: 700 }}>{payload.lab.name}</Tx>
            <Tx style={{ fontSize: 7, color: inkSoft }}>{payload.lab.address}</Tx>
          </View>
          <Tx style={{ fontSize: 9, fontWeight: 700 }}>{`${payload.title} ${payload.number}`}</Tx>
        </View>
        <CopperRule />
      </View>
      <View fixed style={{ position: "absolute", top: A4_HEIGHT - 40, left: 48, right: 48, height: 16, borderTopWidth: 0.5, borderTopColor: rule }} />
      <Tx fixed style={{ position: "absolute", top: A4_HEIGHT - 36, left: 48, width: 380, fontSize: 7, color: inkSoft }}>
        {`${payload.number} · ${payload.statements.resultsRelateToItem}`}
      </Tx>
      <Text
        fixed
        style={{ position: "absolute", top: A4_HEIGHT - 36, right: 48, width: 100, fontSize: 7, color: ink, textAlign: "right" }}
        render={({ pageNumber, totalPages }) => `page ${pageNumber} of ${totalPages}`}
      />
    </>
  );
}

/** The last section: who signed and what it means, the digital signature and check address, the statements, the end mark. */
function ClosingSection({
  payload,
  heading,
  signatures,
  checkUrl,
  qr,
  signingSubject,
}: {
  payload: CertificatePayload;
  heading: string;
  signatures: { heading: string; s: SignatureStatement; note?: string }[];
  checkUrl: string;
  qr: QrModules;
  signingSubject: string;
}) {
  return (
    <View wrap={false}>
      <Tx style={styles.heading}>{heading}</Tx>
      <View style={{ flexDirection: "row", alignItems: "flex-start" }}>
        {signatures.map((x) => (
          <SignatureBlock key={x.heading} heading={x.heading} s={x.s} note={x.note} />
        ))}
        <QrCode modules={qr} size={62} />
      </View>
      <Tx style={{ marginTop: 4 }}>{`Digitally signed with the laboratory's key (PKCS#7, certificate "${signingSubject}"): any change to this file breaks the signature. Check the certificate, its state and this file at ${checkUrl}`}</Tx>
      <Tx style={{ ...styles.small, marginTop: 2 }}>{`${payload.statements.resultsRelateToItem} ${payload.statements.externalProviders} ${payload.statements.reproduction}`}</Tx>
      <View style={{ marginTop: 8, borderTopWidth: 0.8, borderBottomWidth: 0.8, borderColor: ink, paddingVertical: 3 }}>
        <Tx style={{ textAlign: "center", fontWeight: 700, fontSize: 8.5 }}>{`End of certificate ${payload.number}`}</Tx>
      </View>
    </View>
  );
}

type BodyInput = Omit<CertificateDocumentInput, "payload">;

function RunCertificateBody({ payload, payloadSha256, curves, checkUrl, qr, signingSubject }: BodyInput & { payload: RunCertificatePayload }) {
  return (
    <>
      <TitleBlock payload={payload} />
      <LabSection payload={payload} />
      <ItemSection payload={payload} />
      <MethodSection payload={payload} />
      <ConditionsSection payload={payload} />
      <InstrumentsSection payload={payload} />
      <ResultsSection payload={payload} curves={curves} />
      <ConformitySection payload={payload} />
      <UncertaintySection payload={payload} />
      <DeviationsSection payload={payload} />
      <EvidenceSection payload={payload} payloadSha256={payloadSha256} />
      <ClosingSection
        payload={payload}
        heading="11  Review and authorisation"
        signatures={[
          { heading: "Reviewed by", s: payload.review, ...(payload.review.comments && { note: `Comments: ${payload.review.comments}` }) },
          { heading: "Approved for issue by", s: payload.approval },
        ]}
        checkUrl={checkUrl}
        qr={qr}
        signingSubject={signingSubject}
      />
    </>
  );
}

function LotCertificateBody({ payload, payloadSha256, checkUrl, qr, signingSubject }: BodyInput & { payload: LotCertificatePayload }) {
  return (
    <>
      <LotTitleBlock payload={payload} />
      <LabSection payload={payload} />
      <LotItemSection payload={payload} />
      <LotMethodSection payload={payload} />
      <SamplingPlanSection payload={payload} />
      <DrawSection payload={payload} />
      <LotDecisionSection payload={payload} />
      <LotStatisticsSection payload={payload} />
      <View wrap={false}>
        <Tx style={styles.heading}>8  Evidence</Tx>
        <Tx>{`The evidence of each sampled run (its data log, findings and signed review) is kept with the run; a run certificate listed in section 5 states it in full. What this certificate states hashes (SHA-256 of its canonical JSON) to`}</Tx>
        <Tx style={styles.hash}>{payloadSha256}</Tx>
      </View>
      <ClosingSection payload={payload} heading="9  Authorisation" signatures={[{ heading: "Approved for issue by", s: payload.approval }]} checkUrl={checkUrl} qr={qr} signingSubject={signingSubject} />
    </>
  );
}

export function CertificateDocument(input: CertificateDocumentInput) {
  const { payload } = input;
  return (
    <Document title={`${payload.title} ${payload.number}`} author={payload.lab.name} subject={`${payload.title} ${payload.number}`} creator="Cellwright" producer="Cellwright" language="en">
      <Page size="A4" style={styles.page}>
        <PageChrome payload={payload} />
        {payload.subject === "lot" ? <LotCertificateBody {...input} payload={payload} /> : <RunCertificateBody {...input} payload={payload} />}
      </Page>
    </Document>
  );
}

export async function renderCertificateDocument(input: CertificateDocumentInput): Promise<Buffer> {
  return renderToBuffer(<CertificateDocument {...input} />);
}

/** Every character a certificate commonly prints: ASCII, the lab's symbols, and some of the extended Latin subset. */
const WARM_UP_TEXT = `${Array.from({ length: 95 }, (_, i) => String.fromCharCode(32 + i)).join("")} °±≤≥–—·×µΩ…“”‘’ ŁłÓóŰűŐőČčŠšŽž`;
const WARM_UP_CURVE: DischargeCurve = {
  stepId: "warm-up",
  cycle: 1,
  label: "warm-up",
  capacityMAh: Array.from({ length: 400 }, (_, i) => i * 12.5),
  voltageV: Array.from({ length: 400 }, (_, i) => 4.15 - 1.4 * (i / 400) ** 3 - 0.2 * (i / 400)),
};

/**
 * A document of a few pages with what a certificate is made of (every face: both Merriweather subsets, regular
 * and bold, Courier for hashes; a table of rows, a plot, a QR code), rendered when a server starts so the
 * fonts are parsed, their common glyphs read and the layout code warm before the first certificate
 * (preload-certificate-tools.ts). Nothing of it is kept.
 */
export async function renderWarmUpDocument(qr: QrModules): Promise<Buffer> {
  return renderToBuffer(
    <Document title="warm-up" creator="Cellwright" producer="Cellwright">
      <Page size="A4" style={styles.page}>
        <Tx style={styles.heading}>{WARM_UP_TEXT}</Tx>
        <Tx>{WARM_UP_TEXT}</Tx>
        <Text style={styles.hash}>{WARM_UP_TEXT.slice(0, 95)}</Text>
        {Array.from({ length: 90 }, (_, row) => (
          <View key={row} style={{ flexDirection: "row", borderBottomWidth: 0.5, borderBottomColor: rule }}>
            <Tx style={{ width: "40%", color: inkSoft }}>{`Discharge step ${row + 1}, cycle ${row}`}</Tx>
            <Tx style={{ width: "30%", textAlign: "right" }}>{`${(4850 + row * 3.5).toFixed(1)} mAh`}</Tx>
            <Tx style={{ width: "30%", textAlign: "right", fontWeight: 700, color: ink }}>conforms</Tx>
          </View>
        ))}
        <VqPlot curve={WARM_UP_CURVE} figure={1} />
        <VqPlot curve={WARM_UP_CURVE} figure={2} />
        <CopperRule />
        <QrCode modules={qr} size={60} />
      </Page>
    </Document>,
  );
}
