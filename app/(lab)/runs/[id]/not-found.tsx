import { TextLink } from "@/components/ui/text-link";

export default function RunNotFound() {
  return (
    <div>
      <h1 className="mb-2 text-2xl font-bold">No such run</h1>
      <TextLink href="/runs">
        All runs
      </TextLink>
    </div>
  );
}
