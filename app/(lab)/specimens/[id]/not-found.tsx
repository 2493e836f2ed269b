import { TextLink } from "@/components/ui/text-link";

export default function SpecimenNotFound() {
  return (
    <div>
      <h1 className="mb-2 text-2xl font-bold">No such specimen</h1>
      <TextLink href="/specimens">
        All specimens
      </TextLink>
    </div>
  );
}
