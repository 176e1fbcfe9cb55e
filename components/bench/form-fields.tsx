"use client";

import { useEffect, useState } from "react";
import { Controller, useFormContext, type FieldErrors, type FieldValues } from "react-hook-form";
import { numberTextError, readNumberText } from "@/lib/bench/number-text";
import { parseCoefficientText } from "@/lib/dsp";
import { useLatest } from "@/components/hooks/use-latest";
import { errorMessage } from "@/lib/errors";

/** The message of the error at a dotted path (e.g. "cutoffHz.1"), or of its parent when the child has none. */
export function errorAt(errors: FieldErrors<FieldValues>, path: string): string | undefined {
  let node: unknown = errors;
  let found: string | undefined;
  for (const key of path.split(".")) {
    if (node === null || typeof node !== "object") break;
    node = (node as Record<string, unknown>)[key];
    const message = node && typeof node === "object" ? (node as { message?: unknown }).message : undefined;
    if (typeof message === "string") found = message;
  }
  return found;
}

/** The first error message at or below a dotted path (a list's "a" holds the error of "a.0"). */
export function errorUnder(errors: FieldErrors<FieldValues>, path: string): string | undefined {
  const first = (node: unknown): string | undefined => {
    if (node === null || typeof node !== "object") return undefined;
    const message = (node as { message?: unknown }).message;
    if (typeof message === "string") return message;
    for (const [key, child] of Object.entries(node)) {
      if (key === "ref") continue;
      const found = first(child);
      if (found) return found;
    }
    return undefined;
  };
  let node: unknown = errors;
  for (const key of path.split(".")) node = node !== null && typeof node === "object" ? (node as Record<string, unknown>)[key] : undefined;
  return first(node);
}

/** Tells onValidity whether a form holds a usable value each time that changes, and "valid" when the form closes. */
export function useReportValidity(valid: boolean, onValidity?: (valid: boolean) => void) {
  const report = useLatest(onValidity);
  useEffect(() => {
    report.current?.(valid);
  }, [valid, report]);
  useEffect(() => () => report.current?.(true), [report]);
}

/** A field's label, with its unit in brackets when it has one. */
export function FieldLabel({ id, label, unit }: { id: string; label: string; unit?: string }) {
  return (
    <label htmlFor={id} className="label">
      {label}
      {unit && <span className="ml-1 normal-case text-slate-400">({unit})</span>}
    </label>
  );
}

/** A field's error below it, announced as an alert; nothing without a message. */
export function FieldMessage({ id, message }: { id?: string; message?: string }) {
  if (!message) return null;
  return (
    <p id={id} role="alert" className="mt-1 text-xs text-red-700 dark:text-red-300">
      {message}
    </p>
  );
}

const fieldId = (name: string) => `spec-${name.replace(/\./g, "-")}`;

/**
 * A number typed as text (so the browser never rewrites it); empty reads as NaN (refused by the schema) or,
 * when optional, as absent. A decimal comma or other text that is not a number is refused with its own
 * message and reads as NaN, so nothing else is applied or saved in its place.
 */
export function NumberField({ name, label, unit, optional = false }: { name: string; label: string; unit?: string; optional?: boolean }) {
  const { register, formState } = useFormContext();
  const [textError, setTextError] = useState<string | null>(null);
  const message = textError ?? errorAt(formState.errors, name);
  const id = fieldId(name);
  const reg = register(name, { setValueAs: (v: unknown) => readNumberText(v, optional) });
  return (
    <div>
      <FieldLabel id={id} label={label} unit={unit} />
      <input
        id={id}
        type="text"
        inputMode="decimal"
        autoComplete="off"
        spellCheck={false}
        aria-invalid={message ? true : undefined}
        aria-describedby={message ? `${id}-error` : undefined}
        className="field num"
        {...reg}
        onChange={(e) => {
          setTextError(numberTextError(e.target.value));
          void reg.onChange(e);
        }}
      />
      <FieldMessage id={`${id}-error`} message={message} />
    </div>
  );
}

export function SelectField({ name, label, options, onPicked }: { name: string; label: string; options: readonly { value: string; label: string }[]; onPicked?: (v: string) => void }) {
  const { register, formState } = useFormContext();
  const message = errorAt(formState.errors, name);
  const id = fieldId(name);
  const reg = register(name);
  return (
    <div>
      <FieldLabel id={id} label={label} />
      <select
        id={id}
        className="field"
        {...reg}
        onChange={(e) => {
          void reg.onChange(e);
          onPicked?.(e.target.value);
        }}
      >
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
      <FieldMessage id={`${id}-error`} message={message} />
    </div>
  );
}

const show = (v: unknown) => (Array.isArray(v) ? v.map((row) => (Array.isArray(row) ? row.join(", ") : String(row))).join(Array.isArray(v[0]) ? "\n" : ", ") : "");

/**
 * Coefficients typed or pasted as text (numpy, C or semicolon-separated rows; parseCoefficientText). `rows` asks
 * for a list of rows (SOS); otherwise a flat list. A text that does not parse keeps the last good value
 * and says where it stopped.
 */
export function ListField({ name, label, rows = false, lines = 2, hint }: { name: string; label: string; rows?: boolean; lines?: number; hint?: string }) {
  const { control, formState } = useFormContext();
  const [parseError, setParseError] = useState<string | null>(null);
  const id = fieldId(name);
  const message = parseError ?? errorUnder(formState.errors, name);
  return (
    <Controller
      control={control}
      name={name}
      render={({ field }) => (
        <div>
          <FieldLabel id={id} label={label} />
          <textarea
            id={id}
            rows={lines}
            spellCheck={false}
            defaultValue={show(field.value)}
            aria-invalid={message ? true : undefined}
            aria-describedby={message ? `${id}-error` : undefined}
            className="field num text-xs"
            onBlur={field.onBlur}
            onChange={(e) => {
              const text = e.target.value;
              if (text.trim() === "") {
                setParseError(null);
                field.onChange(undefined);
                return;
              }
              try {
                const parsed = parseCoefficientText(text);
                const nested = Array.isArray(parsed[0]);
                if (rows) field.onChange(nested ? parsed : [parsed]);
                else if (nested && (parsed as number[][]).length === 1) field.onChange((parsed as number[][])[0]);
                else if (nested) throw new Error("give one list of numbers here, not rows");
                else field.onChange(parsed);
                setParseError(null);
              } catch (err) {
                // The form must not keep the last list that parsed while the box shows text that does not.
                field.onChange(rows ? [[Number.NaN]] : [Number.NaN]);
                setParseError(errorMessage(err));
              }
            }}
          />
          {hint && !message && <p className="mt-1 text-xs text-slate-500">{hint}</p>}
          <FieldMessage id={`${id}-error`} message={message} />
        </div>
      )}
    />
  );
}
