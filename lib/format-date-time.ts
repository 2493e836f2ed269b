/** A moment as a lab record states it, unambiguous in any country: "2026-12-02 14:03 UTC". */
export function formatDateTime(at: Date | string): string {
  const d = typeof at === "string" ? new Date(at) : at;
  return `${d.toISOString().slice(0, 10)} ${d.toISOString().slice(11, 16)} UTC`;
}

/** The calendar date of a moment in UTC: "2026-12-02". */
export function formatDate(at: Date | string): string {
  return (typeof at === "string" ? new Date(at) : at).toISOString().slice(0, 10);
}
