import Link from "next/link";

export default function NotFound() {
  return (
    <div className="mx-auto max-w-lg px-6 py-24 text-center">
      <p className="text-caption font-semibold uppercase tracking-wide text-ink-subtle">404</p>
      <h1 className="mt-2 text-heading font-semibold">Nothing here</h1>
      <p className="mt-3 text-ink-muted">The page or record does not exist, or you cannot see it.</p>
      <Link href="/" className="mt-6 inline-block font-medium text-accent underline">
        Back to the fleet overview
      </Link>
    </div>
  );
}
