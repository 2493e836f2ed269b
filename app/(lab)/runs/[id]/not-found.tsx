import { NotFoundNote } from "@/components/ui/not-found-note";

export default function RunNotFound() {
  return (
    <NotFoundNote title="No such run" back={{ href: "/runs", words: "All runs" }} />
  );
}
