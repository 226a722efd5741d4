/** The Watch screen (being built; see its issue). */
export function WatchScreen({ projectId }: { projectId: number }) {
  return (
    <section className="panel" aria-label="Watch" data-project={projectId}>
      <h2>Watch</h2>
      <p className="muted">This screen is being built.</p>
    </section>
  );
}
