import Link from "next/link";

export default function NotFound() {
  return (
    <main className="mx-auto max-w-md p-8">
      <h1>Not found</h1>
      <p className="mt-2 text-sm text-slate-700">There is nothing at this address, or you may not see it.</p>
      <p className="mt-4"><Link href="/">Go to your start page</Link></p>
    </main>
  );
}
