/** A titled panel on a record page. */
export function Section({ title, id, actions, children }: { title: string; id?: string; actions?: React.ReactNode; children: React.ReactNode }) {
  return (
    <section id={id} aria-labelledby={id ? `${id}-title` : undefined} className="rounded-lg border border-line bg-panel p-4">
      <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
        <h2 id={id ? `${id}-title` : undefined} className="text-lg font-bold">{title}</h2>
        {actions}
      </div>
      {children}
    </section>
  );
}

/** Said plainly where a part of a page is not built yet. */
export function NotBuiltNote({ children }: { children: React.ReactNode }) {
  return <p className="rounded-md border-2 border-dashed border-line p-3 text-ink-soft"><strong className="text-ink">Not built yet.</strong> {children}</p>;
}

/** Stands in for a section of a page while its records are still being read (the rest of the page is already shown). */
export function SectionLoading({ title }: { title: string }) {
  return (
    <section aria-busy="true" className="rounded-lg border border-line bg-panel p-4">
      <h2 className="mb-3 text-lg font-bold">{title}</h2>
      <p className="text-ink-soft">Loading…</p>
    </section>
  );
}
