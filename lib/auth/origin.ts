/**
 * A state-changing request is same-origin when its Origin header names the host it was sent to.
 * A missing Origin is refused: browsers send it on every cross-site and same-site POST.
 */
export function isSameOrigin(origin: string | null, host: string | null): boolean {
  if (!origin || !host) return false;
  try {
    return new URL(origin).host.toLowerCase() === host.toLowerCase();
  } catch {
    return false;
  }
}
