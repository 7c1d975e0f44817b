"use client";

/** The error boundary of a role area (each area's error.tsx re-exports it). */
export default function AreaError({ reset }: { error: Error; reset: () => void }) {
  return (
    <div role="alert" className="card">
      <h1>This page could not be shown</h1>
      <p className="mt-2 text-sm text-slate-700">The server could not finish the request. Your work saved so far is safe.</p>
      <button className="btn mt-4" onClick={reset}>Try again</button>
    </div>
  );
}
