import type { Metadata } from "next";
import { z } from "zod";
import { InstrumentRow } from "@/components/instruments/instrument-row";
import { FilterBar, FilterCheck } from "@/components/ui/filter-bar";
import { Notice } from "@/components/ui/notice";
import { ActionLink } from "@/components/ui/action-link";
import { PageHeader } from "@/components/ui/page-header";
import { SelectField } from "@/components/ui/select-field";
import { EmptyState, HeaderCell, Table, TableHead } from "@/components/ui/table";
import { getDb } from "@/db";
import { listInstruments } from "@/db/instruments";
import { requirePageAccess } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { DUE_SOON_DAYS } from "@/lib/instruments/calibration-status";
import { INSTRUMENT_KIND_LABELS, INSTRUMENT_KINDS } from "@/lib/instruments/instrument-kind";
import { readLabToday } from "@/lib/instruments/lab-today";
import { rankInstruments } from "@/lib/instruments/rank-instruments";
import { setInstrumentInUseAction } from "../actions";

export const metadata: Metadata = { title: "Instruments" };

const searchSchema = z.object({
  kind: z.enum(INSTRUMENT_KINDS).optional().catch(undefined),
  inuse: z.literal("1").optional().catch(undefined),
});

export default async function InstrumentsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageAccess("/instruments");
  const { kind, inuse } = searchSchema.parse(await searchParams);
  const today = readLabToday();
  const instruments = rankInstruments(await listInstruments(getDb(), { kind, inUseOnly: inuse === "1" }), today);
  const manage = can(user.role, "instrument.manage");
  const inUse = instruments.filter((i) => i.active);
  const overdue = inUse.filter((i) => i.status === "overdue");
  const dueSoon = inUse.filter((i) => i.status === "due soon");
  return (
    <>
      <PageHeader
        title="Instruments"
        lead={`Cycler channels, thermometers, climate chambers, balances and resistance meters with their calibration, those in use first. A run cannot start on an instrument that is overdue or out of use. Calibration dates are read against today, ${today}.`}
        actions={
          manage && (
            <ActionLink href="/instruments/new">
              Register an instrument
            </ActionLink>
          )
        }
      />
      <div className="mb-4 flex flex-col gap-3">
        {overdue.length > 0 && (
          <Notice tone="problem" title={`Overdue for calibration: ${overdue.length}`}>
            No run can start on {overdue.map((i) => i.identifier).join(", ")} until it is recalibrated.
          </Notice>
        )}
        {dueSoon.length > 0 && (
          <Notice tone="caution" title={`Falls due within ${DUE_SOON_DAYS} days: ${dueSoon.length}`}>
            {dueSoon.map((i) => `${i.identifier} (due on ${i.dueOn})`).join(", ")}. Book the recalibration.
          </Notice>
        )}
      </div>
      <FilterBar label="Filter instruments">
        <SelectField filter label="Kind" name="kind" defaultValue={kind ?? ""}>
          <option value="">every kind</option>
          {INSTRUMENT_KINDS.map((k) => (
            <option key={k} value={k}>
              {INSTRUMENT_KIND_LABELS[k]}
            </option>
          ))}
        </SelectField>
        <FilterCheck label="Only instruments in use" name="inuse" checked={inuse === "1"} />
      </FilterBar>
      <Table>
        <TableHead>
          <HeaderCell>Calibration</HeaderCell>
          <HeaderCell>Instrument</HeaderCell>
          <HeaderCell>Accuracy</HeaderCell>
          <HeaderCell>Certificate, calibrated on</HeaderCell>
          <HeaderCell>Due on</HeaderCell>
          {manage && <HeaderCell>Change</HeaderCell>}
        </TableHead>
        <tbody>
          {instruments.map((i) => (
            <InstrumentRow key={i.id} instrument={i} inUseAction={manage ? setInstrumentInUseAction : null} />
          ))}
        </tbody>
      </Table>
      {instruments.length === 0 && <EmptyState>No instruments match.</EmptyState>}
    </>
  );
}
