import type { Permission } from "./permissions";

/**
 * Who may open each route, as the route itself checks it. The route × role matrix test walks app/
 * and fails for any route missing here, then checks every role gets the answer this table implies.
 * `public`: no sign-in; `signed-in`: any active user.
 */
export const ROUTE_ACCESS: Record<string, Permission | "public" | "signed-in"> = {
  "/": "workbench.enter",
  "/sign-in": "public",
  "/audit": "audit.read",
  "/admin/users": "user.manage",
  "/api/me": "signed-in",
  "/api/health": "public",
};
