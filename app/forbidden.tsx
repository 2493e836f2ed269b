import { TextLink } from "@/components/ui/text-link";

export default function Forbidden() {
  return (
    <main className="mx-auto max-w-xl px-4 py-16">
      <h1 className="mb-3 text-2xl font-bold">Not open to your role</h1>
      <p className="mb-4">
        This page belongs to another role in the lab. If your work needs it, ask your lab&apos;s administrator to
        change your role.
      </p>
      <TextLink href="/">
        Back to your workbench
      </TextLink>
    </main>
  );
}
