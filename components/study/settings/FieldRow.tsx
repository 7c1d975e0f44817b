"use client";

import { memo, useState } from "react";
import type { ConfigFieldEntry, FieldSpec } from "@/lib/study/editor";
import { formatSetting, rangeText } from "@/lib/study/editor";

/** The value a field takes when nobody sets it here: the base's, or the schema's default. */
export type Inherited = { value: unknown; from: "base" | "default" };

type Props = {
  id: string;
  /** The form path of the field (its error element is err-PATH). */
  path: string;
  /** Accessible name prefix, e.g. "Factor 2 level 1" or "Base". */
  scope: string;
  field: string;
  entry: ConfigFieldEntry;
  spec: FieldSpec;
  /** The value this editor sets, or undefined when it inherits. */
  value: unknown;
  inheritedValue: unknown;
  inheritedFrom: "base" | "default";
  error: string | undefined;
  unused: boolean;
  readOnly: boolean;
  onSet: (field: string, value: unknown) => void;
};

const INHERIT = "__inherit__";

function NumberInput({ id, name, value, placeholder, invalid, describedBy, readOnly, onChange }: { id: string; name: string; value: unknown; placeholder: string; invalid: boolean; describedBy: string; readOnly: boolean; onChange: (v: unknown) => void }) {
  // Keep what the researcher typed ("0.", "1e") while the form holds the value it means; a
  // change from outside (a preset, "use base") replaces the text.
  const [text, setText] = useState(value === undefined ? "" : String(value));
  const [emitted, setEmitted] = useState<unknown>(value);
  if (!Object.is(value, emitted)) {
    setEmitted(value);
    setText(value === undefined ? "" : String(value));
  }
  return (
    <input
      id={id}
      aria-label={name}
      className="input"
      inputMode="decimal"
      value={text}
      placeholder={placeholder}
      aria-invalid={invalid || undefined}
      aria-describedby={describedBy}
      readOnly={readOnly}
      onChange={(e) => {
        const t = e.target.value;
        const v = t.trim() === "" ? undefined : Number.isFinite(Number(t)) ? Number(t) : t;
        setText(t);
        setEmitted(v);
        onChange(v);
      }}
    />
  );
}

/** One configuration field: its label with unit, an input, the range and default, the error at the field. */
export const FieldRow = memo(function FieldRow({ id, path, scope, field, entry, spec, value, inheritedValue, inheritedFrom, error, unused, readOnly, onSet }: Props) {
  const inherited: Inherited = { value: inheritedValue, from: inheritedFrom };
  const name = `${scope} ${entry.label}`;
  const inheritText = `${inherited.from === "base" ? "base" : "default"}: ${formatSetting(inherited.value)}`;
  const describedBy = `${id}-about${error ? ` err-${path}` : ""}`;
  const set = (v: unknown) => onSet(field, v);
  let control;
  if (entry.setElsewhere) {
    control = <p className="text-sm" id={id}>{formatSetting(inherited.value)}</p>;
  } else if (spec.kind === "number") {
    control = <NumberInput id={id} name={name} value={value} placeholder={inheritText} invalid={!!error} describedBy={describedBy} readOnly={readOnly} onChange={set} />;
  } else {
    const options: [string, string][] =
      spec.kind === "enum" ? spec.options.map((o) => [o, entry.choices?.[o] ?? o])
      : spec.kind === "boolean" ? [["true", "on"], ["false", "off"]]
      : [["null", "none"], ...Array.from({ length: spec.max - spec.min + 1 }, (_, i): [string, string] => [String(spec.min + i), `button ${spec.min + i}`])];
    const current = value === undefined ? INHERIT : String(value);
    control = (
      <select id={id} aria-label={name} className="input" value={current} disabled={readOnly} aria-invalid={!!error || undefined} aria-describedby={describedBy}
        onChange={(e) => {
          const v = e.target.value;
          if (v === INHERIT) set(undefined);
          else if (spec.kind === "boolean") set(v === "true");
          else if (spec.kind === "button") set(v === "null" ? null : Number(v));
          else set(v);
        }}>
        <option value={INHERIT}>({inheritText})</option>
        {options.map(([v, l]) => <option key={v} value={v}>{l}</option>)}
      </select>
    );
  }
  return (
    <div className="space-y-0.5" data-field={field}>
      <label htmlFor={id} className="flex items-baseline justify-between gap-2">
        <span>{entry.label}{entry.unit ? <span className="font-normal text-slate-600"> ({entry.unit})</span> : null}</span>
        {value !== undefined && !readOnly && !entry.setElsewhere && (
          <button type="button" className="text-xs font-normal text-accent underline" onClick={() => set(undefined)} aria-label={`${name}: use the ${inherited.from} value`}>use {inherited.from}</button>
        )}
      </label>
      {control}
      <p id={`${id}-about`} className="text-xs text-slate-600">
        {entry.setElsewhere ?? entry.help}
        {spec.kind === "number" && !entry.setElsewhere ? ` Range ${rangeText(spec)}; default ${formatSetting(spec.defaultValue)}.` : ""}
        {unused ? " Not used by this level's technique." : ""}
      </p>
      {error && <p className="field-error" role="alert" id={`err-${path}`}>{error}</p>}
    </div>
  );
});
