import { NotFoundNote } from "@/components/ui/not-found-note";

export default function InstrumentNotFound() {
  return (
    <NotFoundNote title="No such instrument" back={{ href: "/instruments", words: "The instrument register" }} />
  );
}
