export function normaliseAddress(address: string | null | undefined): string;
export function parseTrustedProxies(setting: string | null | undefined): Set<string>;
export function resolveClientAddress(peer: string | null | undefined, forwardedFor: string | string[] | null | undefined, trusted: Set<string>): string;
export function settleForwardingHeaders(headers: Record<string, string | string[] | undefined>, peer: string | null | undefined, trusted: Set<string>): string;
