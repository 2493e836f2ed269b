import clsx from "clsx";
import type { ReactNode } from "react";

type Tone = "info" | "caution" | "problem" | "done";

const TONES: Record<Tone, { box: string; word: string; mark: string }> = {
  info: { box: "border-rule bg-paper-deep", word: "Note", mark: "i" },
  caution: { box: "border-copper bg-copper-wash", word: "Caution", mark: "⚠" },
  problem: { box: "border-deviates bg-white", word: "Problem", mark: "✕" },
  done: { box: "border-meets bg-white", word: "Done", mark: "✓" },
};

/** A boxed message whose kind is said in words first; the mark and colour only support it. */
export function Notice({ tone = "info", title, children, role }: { tone?: Tone; title?: string; children: ReactNode; role?: "alert" | "status" }) {
  const t = TONES[tone];
  return (
    <div role={role} className={clsx("rounded border-l-4 px-4 py-3 text-sm", t.box)}>
      <p className="font-semibold">
        {/* "i" in a drawn circle: the circled-i character is missing from common Linux fonts. */}
        <span aria-hidden="true" className={tone === "info" ? "mr-1.5 inline-flex h-4 w-4 items-center justify-center rounded-full border border-current font-serif text-[0.65rem] leading-none" : undefined}>
          {t.mark}
          {tone === "info" ? "" : " "}
        </span>
        {title ?? t.word}
      </p>
      <div className="mt-1 text-ink">{children}</div>
    </div>
  );
}
