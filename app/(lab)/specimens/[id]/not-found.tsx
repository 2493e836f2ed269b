import Link from "next/link";

export default function SpecimenNotFound() {
  return (
    <div>
      <h1 className="mb-2 text-2xl font-bold">No such specimen</h1>
      <Link href="/specimens" className="text-copper-deep underline">
        All specimens
      </Link>
    </div>
  );
}
