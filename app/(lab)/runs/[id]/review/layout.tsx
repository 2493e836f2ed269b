import type { ReactNode } from "react";
import { requireAreaAccess } from "@/lib/auth/guards";

// Outside the loading boundary, so a refusal answers with a real 403. Every role that reads runs may
// open the tab: the page tells the run's operator, and roles that do not review, why they cannot.
export default async function RunReviewLayout({ children }: { children: ReactNode }) {
  await requireAreaAccess("/runs/[id]/review");
  return children;
}
