import Link from "next/link";

export default function NotFound() {
  return (
    <main className="mx-auto max-w-xl p-8">
      <h1 className="text-2xl font-semibold">Not here</h1>
      <p className="mt-2 text-muted">This page does not exist, or it belongs to a lab you are not part of.</p>
      <Link href="/" className="mt-4 inline-block">
        Back to your home page
      </Link>
    </main>
  );
}
