import { TextLink } from "@/components/ui/text-link";

export default function NotFound() {
  return (
    <main className="mx-auto max-w-xl px-4 py-16">
      <h1 className="mb-3 text-2xl font-bold">Nothing at this address</h1>
      <p className="mb-4">The page or record you asked for does not exist, or its address was mistyped.</p>
      <TextLink href="/">
        Back to your workbench
      </TextLink>
    </main>
  );
}
