import Link from "next/link";

export default function RunNotFound() {
  return (
    <div>
      <h1 className="mb-2 text-2xl font-bold">No such run</h1>
      <Link href="/runs" className="text-copper-deep underline">
        All runs
      </Link>
    </div>
  );
}
