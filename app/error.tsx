"use client";

export default function ErrorPage({ reset }: { error: Error; reset: () => void }) {
  return (
    <div role="alert" className="mx-auto max-w-lg card space-y-3">
      <h1 className="text-xl font-bold">Something went wrong</h1>
      <p>
        Tidemark could not show this page. If the database was restarting, trying again in a few seconds usually works.
      </p>
      <button type="button" className="btn" onClick={() => reset()}>
        Try again
      </button>
    </div>
  );
}
