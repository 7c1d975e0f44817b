export default function Loading() {
  return <p className="text-sm text-slate-600" role="status">Loading…</p>;
}
