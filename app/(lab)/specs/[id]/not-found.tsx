import Link from "next/link";

export default function SpecNotFound() {
  return (
    <div>
      <h1 className="mb-2 text-2xl font-bold">No such cell specification</h1>
      <Link href="/specs" className="text-copper-deep underline">
        All cell specifications
      </Link>
    </div>
  );
}
