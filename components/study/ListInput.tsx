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
