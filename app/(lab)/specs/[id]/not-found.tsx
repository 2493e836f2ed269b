import { TextLink } from "@/components/ui/text-link";

export default function SpecNotFound() {
  return (
    <div>
      <h1 className="mb-2 text-2xl font-bold">No such cell specification</h1>
      <TextLink href="/specs">
        All cell specifications
      </TextLink>
    </div>
  );
}
