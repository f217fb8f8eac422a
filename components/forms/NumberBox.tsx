'use client';
/**
 * A text box for one number. It keeps what is typed ("1e", "-", "abc") as text so the schema can say what is
 * wrong with it, and hands on a number as soon as the text is one.
 */
import { useState } from 'react';
import { inputCls } from './field-parts';

export interface NumberBoxProps {
  id: string;
  value: unknown;
  onChange: (v: unknown) => void;
  integer: boolean;
  invalid: boolean;
  describedBy?: string;
  /** For boxes without a <label> of their own (vector entries). */
  label?: string;
  /** Blank means "leave it out" rather than "missing". */
  optional?: boolean;
}

export function NumberBox({ id, value, onChange, integer, invalid, describedBy, label, optional }: NumberBoxProps) {
  const shown = typeof value === 'number' ? String(value) : typeof value === 'string' ? value : '';
  const [text, setText] = useState(shown);
  const [last, setLast] = useState<unknown>(value);
  // Follow outside changes (a new starter, a series row) without losing what is being typed.
  if (last !== value) {
    setLast(value);
    if (!(typeof value === 'number' && Number(text) === value)) setText(shown);
  }
  return (
    <input
      id={id}
      type="text"
      inputMode={integer ? 'numeric' : 'decimal'}
      className={`${inputCls} font-mono`}
      value={text}
      aria-label={label}
      aria-invalid={invalid}
      aria-describedby={describedBy}
      onChange={(e) => {
        const t = e.target.value;
        setText(t);
        const n = Number(t);
        if (t.trim() === '') onChange(optional ? undefined : t);
        else onChange(Number.isFinite(n) ? n : t);
      }}
    />
  );
}
