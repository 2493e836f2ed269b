import { TextLink } from "@/components/ui/text-link";

export default function LotNotFound() {
  return (
    <div>
      <h1 className="mb-2 text-2xl font-bold">No such lot</h1>
      <TextLink href="/lots">
        All lots
      </TextLink>
    </div>
  );
}
