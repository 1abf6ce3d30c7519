/** Shown at once while the next page is being prepared on the server. */
export default function Loading() {
  return (
    <div className="status-page loading" role="status" aria-live="polite" data-testid="loading">
      <span className="loading-bar" aria-hidden="true" />
      <p className="muted">Preparing the page…</p>
    </div>
  );
}
