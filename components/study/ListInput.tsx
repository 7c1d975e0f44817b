"use client";

import { useState } from "react";

/** A comma-separated list of numbers ("300, 500"), given to the form as number[]. */
export function NumberListInput({ id, value, onChange, describedBy }: { id: string; value: number[] | undefined; onChange: (v: number[]) => void; describedBy?: string }) {
  const [text, setText] = useState((value ?? []).join(", "));
  return (
    <input
      id={id}
      className="input"
      aria-describedby={describedBy}
      value={text}
      onChange={(e) => {
        setText(e.target.value);
        onChange(e.target.value.split(/[,;\s]+/).filter((s) => s !== "").map(Number));
      }}
    />
  );
}

/** A comma-separated list of labels ("novice, expert"), given to the form as string[]. */
export function TextListInput({ id, value, onChange }: { id: string; value: string[] | undefined; onChange: (v: string[]) => void }) {
  const [text, setText] = useState((value ?? []).join(", "));
  return (
    <input
      id={id}
      className="input"
      value={text}
      onChange={(e) => {
        setText(e.target.value);
        onChange(e.target.value.split(",").map((x) => x.trim()).filter((x) => x !== ""));
      }}
    />
  );
}

const parseValue = (v: string): unknown => (v === "true" ? true : v === "false" ? false : v === "null" ? null : v.trim() !== "" && Number.isFinite(Number(v)) ? Number(v) : v);

/** A level's transfer settings as "name=value, name=value" (e.g. "technique=motion" or "gain=6"). */
export function ConfigInput({ id, value, onChange, label }: { id: string; value: Record<string, unknown> | undefined; onChange: (v: Record<string, unknown>) => void; label: string }) {
  const [text, setText] = useState(Object.entries(value ?? {}).map(([k, v]) => `${k}=${String(v)}`).join(", "));
  return (
    <input
      id={id}
      aria-label={label}
      className="input font-mono text-xs"
      value={text}
      placeholder="technique=motion, gain=6"
      onChange={(e) => {
        setText(e.target.value);
        const out: Record<string, unknown> = {};
        for (const part of e.target.value.split(",")) {
          const [k, ...rest] = part.split("=");
          if (k && k.trim() && rest.length) out[k.trim()] = parseValue(rest.join("=").trim());
        }
        onChange(out);
      }}
    />
  );
}
