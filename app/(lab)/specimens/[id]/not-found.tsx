import { NotFoundNote } from "@/components/ui/not-found-note";

export default function SpecimenNotFound() {
  return (
    <NotFoundNote title="No such specimen" back={{ href: "/specimens", words: "All specimens" }} />
  );
}
