import type { Role } from "@/lib/auth/permissions";

/** What each role does in the lab, and which parts of the workbench serve it today. */
export const ROLE_OVERVIEW: Record<Role, { job: string; later: string[]; now: { href: string; label: string }[] }> = {
  admin: {
    job: "You keep the workbench in order: who may sign in and in which role, the lab's details, the instrument register with its calibration dates, and the key that signs certificates.",
    now: [
      { href: "/admin/users", label: "Add people, change roles, deactivate accounts" },
      { href: "/audit", label: "Read the audit trail" },
      { href: "/procedures", label: "Look up released procedures" },
    ],
    later: [
      "Instrument register: cycler channels, thermometers, balances and resistance meters with calibration due dates",
      "Lab details and the certificate signing key",
      "Outgoing e-mail log",
    ],
  },
  engineer: {
    job: "You turn a clause of a standard into a procedure the lab can run, keep the library of cell specifications, review runs you did not operate, and sign certificates.",
    now: [
      { href: "/procedures", label: "Write procedures, send them for review, release a colleague's" },
      { href: "/procedures/new", label: "Start a procedure from a built-in template" },
      { href: "/specs", label: "Keep the cell specification library and datasheets" },
    ],
    later: ["Review of submitted runs and signed certificates", "Lot statistics and rate-capability comparisons"],
  },
  operator: {
    job: "You run released procedures on a cycler channel: tick off each step, record the ambient temperature and the set-points you programmed, upload the cycler's data log and submit the run.",
    now: [
      { href: "/procedures", label: "Read the released procedures and their set-points for a cell" },
      { href: "/specs", label: "Look up cell specifications" },
    ],
    later: [
      "Runs: the step sheet for each specimen, ambient readings and data-log upload",
      "Specimens and lots as they arrive",
    ],
  },
  auditor: {
    job: "You check the lab's work without changing it: released procedures, runs with their evidence, certificates and their signatures, and the audit trail behind them.",
    now: [
      { href: "/audit", label: "Read the audit trail" },
      { href: "/procedures", label: "Read released procedures and compare their versions" },
    ],
    later: ["Certificates: download, verify signatures, evidence bundles for assessors"],
  },
};
