/** datetime-local value in the browser's zone, from an ISO instant. */
export function toLocalInput(iso: string | undefined): string {
  if (!iso) return "";
  const d = new Date(iso);
  return new Date(d.getTime() - d.getTimezoneOffset() * 60_000).toISOString().slice(0, 19);
}

/** ISO instant from a datetime-local value read in the browser's zone. */
export function toIso(local: string): string {
  return local ? new Date(local).toISOString() : "";
}
