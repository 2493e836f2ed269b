"use client";

import { SectionError } from "@/components/ui/section-error";

export default function RootError(props: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <main className="mx-auto max-w-xl px-4 py-16">
      <SectionError {...props} />
    </main>
  );
}
