import { TextLink } from "@/components/ui/text-link";

export default function CertificateNotFound() {
  return (
    <div>
      <h1 className="mb-2 text-2xl font-bold">No such certificate</h1>
      <TextLink href="/certificates">
        All certificates
      </TextLink>
    </div>
  );
}
