import type { Metadata } from "next";
import { PageHeader } from "@/components/ui/page-header";
import { getDb } from "@/db";
import { listInstruments } from "@/db/instruments";
import { getProcedureVersion, listProcedures } from "@/db/procedures";
import { listSpecimens } from "@/db/specimens";
import { requirePageAccess } from "@/lib/auth/guards";
import { INSTRUMENT_KIND_LABELS } from "@/lib/instruments/instrument-kind";
import { readLabToday } from "@/lib/instruments/lab-today";
import { rankInstruments } from "@/lib/instruments/rank-instruments";
import { startRunAction } from "./actions";
import { describeCalibration } from "./describe-calibration";
import { StartRunForm } from "./start-run-form";

export const metadata: Metadata = { title: "Start a run" };

export default async function StartRunPage() {
  await requirePageAccess("/runs/new");
  const db = getDb();
  const today = readLabToday();
  const [procedures, specimens, instruments] = await Promise.all([listProcedures(db, { releasedOnly: true }), listSpecimens(db), listInstruments(db)]);
  const versions = (
    await Promise.all(procedures.map((p) => (p.releasedNumber === null ? null : getProcedureVersion(db, p.id, p.releasedNumber))))
  ).flatMap((v) => (v && v.status === "released" ? [{ id: v.id, label: `${v.code} version ${v.number}: ${v.title}` }] : []));
  return (
    <>
      <PageHeader
        title="Start a run"
        lead="Choose the released procedure, the specimen and the instruments you will use. The set-points are worked out for the specimen's cell now and frozen into the run."
      />
      <StartRunForm
        action={startRunAction}
        versions={versions}
        specimens={specimens.map((s) => ({
          id: s.id,
          label: `${s.identifier} · ${s.specification.maker} ${s.specification.model}${s.lot ? ` · lot ${s.lot.identifier}` : ""}`,
        }))}
        instruments={rankInstruments(instruments, today).map((i) => ({
          id: i.id,
          label: `${INSTRUMENT_KIND_LABELS[i.kind]} ${i.identifier}`,
          calibration: describeCalibration(i),
          overdue: i.status === "overdue",
        }))}
      />
    </>
  );
}
