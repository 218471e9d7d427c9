/** What a section shows while it holds nothing yet: plain words, no invented numbers. */
export function EmptyState({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <section className="card border-dashed text-center" aria-label={title}>
      <svg viewBox="0 0 48 24" className="mx-auto mb-3 h-8 w-16 text-ink-300" aria-hidden="true">
        <path
          d="M10 20 C10 9 17 5 24 5 C31 5 38 9 38 20 Z"
          fill="none"
          stroke="currentColor"
          strokeWidth="2"
        />
        <path d="M4 20 H44" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
      </svg>
      <h2 className="text-base">{title}</h2>
      <div className="mx-auto mt-1 max-w-prose text-sm text-ink-600">{children}</div>
    </section>
  );
}

export function PageHeader({ title, lead }: { title: string; lead?: string }) {
  return (
    <header className="mb-6">
      <h1>{title}</h1>
      {lead ? <p className="mt-1 max-w-prose text-sm text-ink-600">{lead}</p> : null}
    </header>
  );
}
