import Link from "next/link";

export default function NotFound() {
  return (
    <div className="mx-auto max-w-md py-24 text-center">
      <h1 className="text-xl font-semibold">Nothing here</h1>
      <p className="mt-2 text-sm text-ink-soft">This page does not exist, or it belongs to data you do not have access to.</p>
      <Link href="/" className="mt-4 inline-block text-sm text-glow-deep hover:underline">
        Back to the overview
      </Link>
    </div>
  );
}
