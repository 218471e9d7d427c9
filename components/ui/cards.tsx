import type { ReactNode } from 'react';

/** A card holding a form: its heading, a line on what the form does, then the form. */
export function FormCard({
  title,
  intro,
  width,
  children,
}: {
  title: string;
  intro: ReactNode;
  /** A max-width class, like max-w-3xl: a form reads better narrower than the page. */
  width: string;
  children: ReactNode;
}) {
  return (
    <section className={`card mb-6 ${width}`}>
      <h2 className="mb-1">{title}</h2>
      <p className="mb-3 text-sm text-ink-600">{intro}</p>
      {children}
    </section>
  );
}

/** A card listing records (usually a table), or saying in plain words that there are none. */
export function ListCard({
  title,
  count,
  emptyText,
  children,
}: {
  title: string;
  /** How many records the list holds; with none, `emptyText` stands in its place. */
  count: number;
  emptyText: string;
  children: ReactNode;
}) {
  return (
    <section className="card mb-6">
      <h2 className="mb-3">{title}</h2>
      {count === 0 ? <p className="text-sm text-ink-600">{emptyText}</p> : children}
    </section>
  );
}
