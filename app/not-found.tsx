import Link from 'next/link';

export default function NotFound() {
  return (
    <main className="mx-auto max-w-lg px-4 py-20 text-center">
      <p className="text-sm font-medium text-ink-500">404 · Not found</p>
      <h1 className="mt-2">There is nothing at this address</h1>
      <p className="mt-3 text-sm text-ink-600">Check the link, or start again from the dashboard.</p>
      <Link href="/dashboard" className="btn-quiet mt-6">
        Back to the dashboard
      </Link>
    </main>
  );
}
