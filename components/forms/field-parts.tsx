/**
 * What every form control shares: its props, its ids, its label with the unit, its help line and its message.
 * The controls themselves are one file per kind of field (NumberField.tsx, ObjectField.tsx, …); Field.tsx picks.
 */
import { useId, type ComponentType } from 'react';
import type { FieldInfo } from './describe';
import { titleOf } from './describe';

export interface FieldProps {
  /** The field's key in its parent object (words it when the schema gives no title). */
  name: string;
  path: (string | number)[];
  info: FieldInfo;
  value: unknown;
  onChange: (v: unknown) => void;
  /** Dotted path → message (messages.ts). */
  errors: Map<string, string>;
  /** Keys not to draw (only at the top level). */
  skip?: Set<string>;
  /** A label other than the schema's (a list item's "Site class 2"). */
  labelOverride?: string;
  /** Draw an object's fields without a box of their own (the top level, an optional group's body). */
  bare?: boolean;
}

/** Fields that hold other fields get the dispatcher passed in, so no file imports Field.tsx back. */
export interface ContainerProps extends FieldProps {
  Field: ComponentType<FieldProps>;
}

export const inputCls =
  'w-full rounded-md border border-rule bg-card px-2 py-1 text-sm text-ink focus:border-tide aria-[invalid=true]:border-clay aria-[invalid=true]:bg-clay-pale/40';

export function joinPath(p: (string | number)[]): string {
  return p.map(String).join('.');
}

/** Ids, words and message of one field. */
export function useFieldText(props: FieldProps) {
  const uid = useId();
  const key = joinPath(props.path);
  const id = `f-${key.replace(/\./g, '-') || 'root'}-${uid.replace(/[^a-zA-Z0-9]/g, '')}`;
  return {
    id,
    errId: `${id}-err`,
    err: props.errors.get(key),
    title: props.labelOverride ?? titleOf(props.info, props.name),
    unit: props.info.unit,
    help: props.info.help,
  };
}

export function FieldLabel({ htmlFor, title, unit }: { htmlFor?: string; title: string; unit?: string }) {
  return (
    <label htmlFor={htmlFor} className="block text-xs font-medium text-ink-soft">
      {title}
      {unit ? <span className="ml-1 font-normal text-ink-soft/80">({unit})</span> : null}
    </label>
  );
}

export function ErrorText({ id, message }: { id?: string; message?: string }) {
  if (!message) return null;
  return (
    <p id={id} className="mt-0.5 text-xs text-clay">
      {message}
    </p>
  );
}

export function Hint({ text }: { text?: string }) {
  return text ? <p className="mt-0.5 text-xs text-ink-soft">{text}</p> : null;
}

/** What a control shows: the value, or the schema's default while the value is left out (the schema fills it in). */
export function shownValue({ value, info }: Pick<FieldProps, 'value' | 'info'>): unknown {
  return value === undefined ? info.fallback : value;
}

/** The message when there is one, else the help line. */
export function Note({ errId, err, help }: { errId: string; err?: string; help?: string }) {
  return err ? <ErrorText id={errId} message={err} /> : <Hint text={help} />;
}
