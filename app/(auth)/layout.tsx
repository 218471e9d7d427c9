import { Wordmark } from '@/components/ui/logo';

export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <main className="flex min-h-screen flex-col items-center justify-center px-4 py-12">
      <div className="mb-8">
        <Wordmark />
      </div>
      <div className="card w-full max-w-md">{children}</div>
      <p className="mt-6 max-w-md text-center text-xs text-ink-500">
        Beadline supports your lab&apos;s validated procedure and qualified sign-off; it does not
        replace them.
      </p>
    </main>
  );
}
