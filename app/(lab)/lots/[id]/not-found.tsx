import { NotFoundNote } from "@/components/ui/not-found-note";

export default function LotNotFound() {
  return (
    <NotFoundNote title="No such lot" back={{ href: "/lots", words: "All lots" }} />
  );
}
