import { z } from "zod";
import { getDb } from "@/db";
import { listInstruments } from "@/db/instruments";
import { apiRoute } from "@/lib/auth/guards";
import { INSTRUMENT_KINDS } from "@/lib/instruments/instrument-kind";
import { readLabToday } from "@/lib/instruments/lab-today";
import { rankInstruments } from "@/lib/instruments/rank-instruments";

const querySchema = z.object({
  kind: z.enum(INSTRUMENT_KINDS).optional(),
  inuse: z.enum(["0", "1"]).optional(),
});

/** The register with each instrument's calibration status as of today, those in use first; `?inuse=1` leaves out the rest. */
export const GET = apiRoute("/api/instruments", "GET", async (req) => {
  const { kind, inuse } = querySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  const today = readLabToday();
  const instruments = await listInstruments(getDb(), { kind, inUseOnly: inuse === "1" });
  return Response.json({ today, instruments: rankInstruments(instruments, today) });
});
