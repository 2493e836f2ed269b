import type { Role } from "@/lib/auth/permissions";

/** What each role does in the lab, and which parts of the workbench serve it today. */
export const ROLE_OVERVIEW: Record<Role, { job: string; now: { href: string; label: string }[] }> = {
  admin: {
    job: "You keep the workbench in order: who may sign in and in which role, the lab's details, the instrument register with its calibration dates, and the key that signs certificates.",
    now: [
      { href: "/admin/users", label: "Add people, change roles, deactivate accounts" },
      { href: "/instruments", label: "Keep the instrument register and its calibration dates" },
      { href: "/audit", label: "Read the audit trail" },
      { href: "/admin/signing-key", label: "The key that signs certificates" },
      { href: "/admin/mail", label: "Outgoing e-mail and calibration reminders" },
    ],
  },
  engineer: {
    job: "You turn a clause of a standard into a procedure the lab can run, keep the library of cell specifications, review runs you did not operate, and sign certificates.",
    now: [
      { href: "/procedures", label: "Write procedures, send them for review, release a colleague's" },
      { href: "/procedures/new", label: "Start a procedure from a built-in template" },
      { href: "/specs", label: "Keep the cell specification library and datasheets" },
      { href: "/runs?status=submitted", label: "Review submitted runs you did not operate: return them or sign them as reviewed" },
      { href: "/lots", label: "Lot statistics, sampling and rate-capability comparisons" },
    ],
  },
  operator: {
    job: "You run released procedures on a cycler channel: tick off each step, record the ambient temperature and the set-points you programmed, upload the cycler's data log and submit the run.",
    now: [
      { href: "/runs/new", label: "Start a run of a released procedure on a specimen" },
      { href: "/runs", label: "Continue a run: step sheet, data log, findings" },
      { href: "/runs?status=returned&mine=1", label: "Correct runs returned to you with a reviewer's comments" },
      { href: "/specimens", label: "Register specimens and lots as they arrive" },
    ],
  },
  auditor: {
    job: "You check the lab's work without changing it: released procedures, runs with their evidence, certificates and their signatures, and the audit trail behind them.",
    now: [
      { href: "/audit", label: "Read the audit trail" },
      { href: "/runs", label: "Read runs with their step records, logs and findings" },
      { href: "/procedures", label: "Read released procedures and compare their versions" },
      { href: "/certificates", label: "Certificates: download, verify their signatures, evidence bundles" },
    ],
  },
};
