export default function Loading() {
  return (
    <p role="status" className="text-ink-soft">
      Loading…
    </p>
  );
}
