import type { DesignErrors } from "./formTypes";

/** The message at a dotted path of the form's errors (react-hook-form nests them like the values). */
export function errorAt(errors: DesignErrors, path: string): string | undefined {
  let node: unknown = errors;
  for (const key of path.split(".")) node = node && typeof node === "object" ? (node as Record<string, unknown>)[key] : undefined;
  const m = node && typeof node === "object" ? (node as { message?: unknown; root?: { message?: unknown } }) : undefined;
  const msg = m?.message ?? m?.root?.message;
  return typeof msg === "string" ? msg : undefined;
}

/** A field's error, with the id err-PATH that tests and aria-describedby use. */
export function Err({ errors, path }: { errors: DesignErrors; path: string }) {
  const m = errorAt(errors, path);
  return m ? <p className="field-error" role="alert" id={`err-${path}`}>{m}</p> : null;
}
