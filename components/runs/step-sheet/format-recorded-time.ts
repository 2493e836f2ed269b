/** A recorded instant in the server's (the lab's) zone, with the zone named: "1 Dec 2026, 23:24:05 UTC". */
export function formatRecordedTime(iso: string): string {
  return new Date(iso).toLocaleString("en-GB", { dateStyle: "medium", timeStyle: "long" });
}
