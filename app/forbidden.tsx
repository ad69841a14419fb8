import Link from "next/link";

export default function Forbidden() {
  return (
    <div className="mx-auto max-w-lg px-6 py-24 text-center" data-testid="forbidden">
      <p className="text-caption font-semibold uppercase tracking-wide text-act">403 · Not allowed</p>
      <h1 className="mt-2 text-heading font-semibold">Your role cannot open this page</h1>
      <p className="mt-3 text-ink-muted">
        Ask an administrator if you need access. Everything you are allowed to use is in the navigation.
      </p>
      <Link href="/" className="mt-6 inline-block font-medium text-accent underline">
        Back to the fleet overview
      </Link>
    </div>
  );
}
