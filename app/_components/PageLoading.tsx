/**
 * Shown at once while a planner page is being prepared on the server (its `loading.tsx` re-exports this).
 *
 * Only in segments where no page calls `notFound()`: a loading page starts the response (status 200)
 * before the page runs, so a `notFound()` after it would show the not-found page with status 200. That is
 * why there is no app/loading.tsx for the whole app (test/e2e/pages.e2e.ts checks that a missing plan or
 * template still answers 404).
 */
export default function PageLoading() {
  return (
    <div className="status-page loading" role="status" aria-live="polite" data-testid="loading">
      <span className="loading-bar" aria-hidden="true" />
      <p className="muted">Preparing the page…</p>
    </div>
  );
}
