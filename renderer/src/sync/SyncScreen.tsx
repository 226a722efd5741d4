/** The Sync screen (being built; see its issue). */
export function SyncScreen({ projectId }: { projectId: number }) {
  return (
    <section className="panel" aria-label="Sync" data-project={projectId}>
      <h2>Sync</h2>
      <p className="muted">This screen is being built.</p>
    </section>
  );
}
