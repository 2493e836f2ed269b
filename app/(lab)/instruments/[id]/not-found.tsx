import Link from "next/link";

export default function InstrumentNotFound() {
  return (
    <div>
      <h1 className="mb-2 text-2xl font-bold">No such instrument</h1>
      <Link href="/instruments" className="text-copper-deep underline">
        The instrument register
      </Link>
    </div>
  );
}
