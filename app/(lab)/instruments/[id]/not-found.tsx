import { TextLink } from "@/components/ui/text-link";

export default function InstrumentNotFound() {
  return (
    <div>
      <h1 className="mb-2 text-2xl font-bold">No such instrument</h1>
      <TextLink href="/instruments">
        The instrument register
      </TextLink>
    </div>
  );
}
