import { NotFoundNote } from "@/components/ui/not-found-note";

export default function CertificateNotFound() {
  return (
    <NotFoundNote title="No such certificate" back={{ href: "/certificates", words: "All certificates" }} />
  );
}
