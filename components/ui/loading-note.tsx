export function LoadingNote({ what }: { what: string }) {
  return (
    <p className="text-ink-soft" role="status">
      Loading {what}…
    </p>
  );
}
