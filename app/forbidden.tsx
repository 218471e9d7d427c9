import Link from 'next/link';

export default function Forbidden() {
  return (
    <main className="mx-auto max-w-lg px-4 py-20 text-center">
      <p className="text-sm font-medium text-coral-700">403 · Not allowed</p>
      <h1 className="mt-2">Your role cannot open this page</h1>
      <p className="mt-3 text-sm text-ink-600">
        This part of Beadline belongs to another role in your organization. Ask one of its admins if
        you need access.
      </p>
      <Link href="/dashboard" className="btn-quiet mt-6">
        Back to the dashboard
      </Link>
    </main>
  );
}
