import Link from "next/link";

export default function CertificateNotFound() {
  return (
    <div>
      <h1 className="mb-2 text-2xl font-bold">No such certificate</h1>
      <Link href="/certificates" className="text-copper-deep underline">
        All certificates
      </Link>
    </div>
  );
}
