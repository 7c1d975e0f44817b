"use client";

export default function ErrorPage({ reset }: { error: Error; reset: () => void }) {
  return (
    <main className="mx-auto max-w-md p-8" role="alert">
      <h1>Something went wrong</h1>
      <p className="mt-2 text-sm text-slate-700">The server could not finish this request. Your work saved so far is safe.</p>
      <button className="btn mt-4" onClick={reset}>Try again</button>
    </main>
  );
}
