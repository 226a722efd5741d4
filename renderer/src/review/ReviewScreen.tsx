/** The Review screen (first step: the analysis strip and the queue's counts). */
import { AnalysisBar } from '../analysis/AnalysisBar.tsx';
import { useServices } from '../app/context.ts';
import { useLive } from '../app/useLive.ts';

export function ReviewScreen({ projectId }: { projectId: number }) {
  const { db } = useServices();
  const counts = useLive(async () => {
    const rows = await db.corrections.where('projectId').equals(projectId).toArray();
    return { open: rows.filter((r) => r.status === 'proposed').length, done: rows.filter((r) => r.status !== 'proposed').length };
  }, [db, projectId]);
  return (
    <section className="panel" aria-label="Review" data-project={projectId}>
      <h2>Review</h2>
      <AnalysisBar projectId={projectId} />
      {counts && (
        <p data-testid="review-counts">
          {counts.done} done · {counts.open} left
        </p>
      )}
    </section>
  );
}
