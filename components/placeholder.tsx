/** A page whose feature is not built yet says so plainly instead of pretending. */
export function NotBuiltYet({ title, what }: { title: string; what: string }) {
  return (
    <section className="max-w-2xl space-y-3">
      <h1 className="text-2xl font-bold">{title}</h1>
      <div className="rounded-lg border-2 border-dashed border-line bg-panel p-5">
        <p className="font-semibold">Not built yet.</p>
        <p className="mt-1 text-ink-soft">{what}</p>
      </div>
    </section>
  );
}
