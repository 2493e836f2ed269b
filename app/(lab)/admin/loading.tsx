export default function Loading() {
  return <p className="text-ink-soft" role="status">Loading the administration pages…</p>;
}
