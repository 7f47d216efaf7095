"use client";

export default function AppError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div className="mx-auto max-w-md py-20 text-center">
      <h1 className="text-xl font-semibold">This page could not be shown</h1>
      <p className="mt-2 text-sm text-ink-soft">
        Something failed on our side. Nothing you stored was changed. Try again; if it keeps failing, the service status is at /api/health.
      </p>
      <button type="button" onClick={reset} className="mt-4 rounded-md bg-glow px-4 py-2 text-sm font-medium text-white hover:bg-glow-deep">
        Try again
      </button>
    </div>
  );
}
