import { NotFoundNote } from "@/components/ui/not-found-note";

export default function ProcedureNotFound() {
  return (
    <NotFoundNote title="No such procedure" back={{ href: "/procedures", words: "All procedures" }}>
      The procedure or version you asked for does not exist, or is not released yet.
    </NotFoundNote>
  );
}
