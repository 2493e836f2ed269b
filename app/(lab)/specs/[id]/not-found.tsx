import { NotFoundNote } from "@/components/ui/not-found-note";

export default function SpecNotFound() {
  return (
    <NotFoundNote title="No such cell specification" back={{ href: "/specs", words: "All cell specifications" }} />
  );
}
