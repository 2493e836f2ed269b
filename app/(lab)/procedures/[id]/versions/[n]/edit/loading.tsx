export default function Loading() {
  return (
    <p className="text-ink-soft" role="status">
      Loading the procedure editor…
    </p>
  );
}
