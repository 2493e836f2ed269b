// Types for scripts/s3-fake-guard.mjs (plain JavaScript so the stand-in runs on node without a build).
import type { IncomingHttpHeaders } from "node:http";

export interface StoreKeys {
  accessKeyId: string;
  secretAccessKey: string;
}
export function verifySignature(req: { method?: string; url?: string; headers: IncomingHttpHeaders }, keys: StoreKeys): void;
export function decodeAwsChunked(body: Buffer): { content: Buffer; trailers: Record<string, string> };
export function s3Guard(keys: StoreKeys): (ctx: unknown, next: () => Promise<unknown>) => Promise<unknown>;
