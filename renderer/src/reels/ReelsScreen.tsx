/** The Reels screen (being built; see its issue). */
export function ReelsScreen({ projectId }: { projectId: number }) {
  return (
    <section className="panel" aria-label="Reels" data-project={projectId}>
      <h2>Reels</h2>
      <p className="muted">This screen is being built.</p>
    </section>
  );
}
