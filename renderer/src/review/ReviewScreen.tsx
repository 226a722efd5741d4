/** The Review screen (being built; see its issue). */
export function ReviewScreen({ projectId }: { projectId: number }) {
  return (
    <section className="panel" aria-label="Review" data-project={projectId}>
      <h2>Review</h2>
      <p className="muted">This screen is being built.</p>
    </section>
  );
}
