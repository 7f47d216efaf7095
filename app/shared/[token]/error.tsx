"use client";

// A fault while reading a shared link: a plain sentence, never a stack trace.
export default function SharedLinkError() {
  return (
    <div className="mx-auto max-w-md py-16 text-center" role="alert">
      <h1 className="text-xl font-semibold">This shared data could not be shown</h1>
      <p className="mt-2 text-sm text-ink-soft">Something went wrong on our side. Try again in a minute.</p>
    </div>
  );
}
