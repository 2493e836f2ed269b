import type { SignedInUser } from "@/lib/auth/signed-in-user";

/** Who sent a log part: an operator from the log page, or a cycler's push command with its token. */
export type LogPartSender = { kind: "user"; user: SignedInUser } | { kind: "machine"; tokenId: string; label: string };

/** How a sender is written in the audit trail. */
export function senderAuditActor(sender: LogPartSender): { actorId: string | null; actorLabel: string } {
  return sender.kind === "user"
    ? { actorId: sender.user.id, actorLabel: `${sender.user.displayName} <${sender.user.email}>` }
    : { actorId: null, actorLabel: `push from ${sender.label}` };
}

/** How the part list says who sent a part. */
export function describeSender(p: { uploadedByName: string | null; machineLabel: string | null }): string {
  if (p.machineLabel) return `pushed by ${p.machineLabel}`;
  return p.uploadedByName ? `uploaded by ${p.uploadedByName}` : "uploaded";
}
