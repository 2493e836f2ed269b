import Link from "next/link";

export default function LotNotFound() {
  return (
    <div>
      <h1 className="mb-2 text-2xl font-bold">No such lot</h1>
      <Link href="/lots" className="text-copper-deep underline">
        All lots
      </Link>
    </div>
  );
}
