import { publicUrl } from "@/lib/public-url";

/** Plain-text notices, in the lab's words. Each names the record and links to it. */
export interface ComposedMail {
  subject: string;
  body: string;
}

const FOOTER = "\n\n— Cellwright, on behalf of your laboratory. This message was sent automatically; reply to your lab, not to it.";

export function composeRunSubmitted(input: { runNumber: string; runId: string; specimen: string; procedure: string; operatorName: string }): ComposedMail {
  return {
    subject: `Run ${input.runNumber} submitted for review`,
    body:
      `${input.operatorName} submitted run ${input.runNumber} (${input.procedure} on specimen ${input.specimen}) for review.\n\n` +
      `Review it (you may not review a run you operated): ${publicUrl(`/runs/${input.runId}/review`)}` +
      FOOTER,
  };
}

export function composeProcedureAwaitingRelease(input: { procedureId: string; code: string; number: number; title: string; submitterName: string }): ComposedMail {
  return {
    subject: `Procedure ${input.code} version ${input.number} waits for release`,
    body:
      `${input.submitterName} submitted procedure ${input.code} version ${input.number} “${input.title}” for review.\n\n` +
      `Read it, compare it with the version before, and release it with your signature or return it to its author (you may not release a version you wrote or submitted): ${publicUrl(`/procedures/${input.procedureId}`)}` +
      FOOTER,
  };
}

export function composeRunReturned(input: { runNumber: string; runId: string; reviewerName: string; comments: string }): ComposedMail {
  return {
    subject: `Run ${input.runNumber} returned to you`,
    body:
      `${input.reviewerName} returned run ${input.runNumber} with these comments:\n\n${input.comments}\n\n` +
      `Correct the records or upload the log again, then submit the run: ${publicUrl(`/runs/${input.runId}`)}` +
      FOOTER,
  };
}

export function composeCertificateIssued(input: { certificateNumber: string; runOrLot: string; verdict: string; issuerName: string; replaces?: string }): ComposedMail {
  return {
    subject: `Certificate ${input.certificateNumber} issued${input.replaces ? ` (replaces ${input.replaces})` : ""}`,
    body:
      `${input.issuerName} issued certificate ${input.certificateNumber} for ${input.runOrLot}: ${input.verdict}.` +
      (input.replaces ? `\nIt replaces certificate ${input.replaces}, which is now superseded.` : "") +
      `\n\nOpen it: ${publicUrl(`/certificates/${input.certificateNumber}`)}\nPublic check: ${publicUrl(`/check/${input.certificateNumber}`)}` +
      FOOTER,
  };
}

export function composeCalibrationDue(input: { instrument: string; dueOn: string; daysLeft: number; instrumentId: string }): ComposedMail {
  const when = input.daysLeft < 0 ? `was due on ${input.dueOn}` : input.daysLeft === 0 ? `is due today (${input.dueOn})` : `is due on ${input.dueOn}, in ${input.daysLeft} day${input.daysLeft === 1 ? "" : "s"}`;
  return {
    subject: `Calibration of ${input.instrument} ${input.daysLeft < 0 ? `overdue (was due on ${input.dueOn})` : `due on ${input.dueOn}`}`,
    body:
      `The calibration of ${input.instrument} ${when}. Runs cannot start on an instrument whose calibration is overdue.\n\n` +
      `Once it is recalibrated, record the new certificate and due date: ${publicUrl(`/instruments/${input.instrumentId}/edit`)}` +
      FOOTER,
  };
}

export function composeEnduranceStopReached(input: { runNumber: string; runId: string; specimen: string; cycle: number; reason: string }): ComposedMail {
  return {
    subject: `Run ${input.runNumber}: stop criterion met at cycle ${input.cycle}`,
    body:
      `The endurance test of run ${input.runNumber} (specimen ${input.specimen}) met its stop criterion at cycle ${input.cycle}: ${input.reason}.\n\n` +
      `Stop the cycler channel as your lab's rules say, record the remaining steps, and look at the trend: ${publicUrl(`/runs/${input.runId}/results`)}` +
      FOOTER,
  };
}

export function composeRunStalled(input: { runNumber: string; runId: string; hours: number; lastArrival: string; lastCycle: number | null }): ComposedMail {
  return {
    subject: `Run ${input.runNumber}: no log data for ${input.hours} hours`,
    body:
      `No samples have reached run ${input.runNumber} since ${input.lastArrival} UTC (more than ${input.hours} hours)` +
      `${input.lastCycle === null ? "" : `; the last cycle with results is cycle ${input.lastCycle}`}. The cycler, its computer or the connection may have stopped.\n\n` +
      `Check the channel and the cell under the lab's own safety rules, then the run: ${publicUrl(`/runs/${input.runId}/results`)}` +
      FOOTER,
  };
}
