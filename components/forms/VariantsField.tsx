'use client';
/** One of several shapes told apart by a key (an occupation domain's kind): pick the shape, then its fields. */
import { initialValue, titleOf } from './describe';
import { FieldLabel, Hint, inputCls, useFieldText, type ContainerProps } from './field-parts';

export function VariantsField(props: ContainerProps) {
  const { id, title, help } = useFieldText(props);
  const { Field, info, value, path, errors, name, onChange } = props;
  if (info.shape.kind !== 'variants') return null;
  const { discriminator, options } = info.shape;
  const obj = (value && typeof value === 'object' ? value : {}) as Record<string, unknown>;
  const current = options.find((o) => o.value === String(obj[discriminator])) ?? options[0];
  const tag = current.info.shape.kind === 'object' ? current.info.shape.fields.find((f) => f.key === discriminator)?.info : undefined;
  return (
    <fieldset className="rounded-md border border-rule p-2">
      <legend className="px-1 text-xs font-semibold text-ink">{title}</legend>
      <FieldLabel htmlFor={id} title={titleOf(tag, discriminator)} />
      <select id={id} className={inputCls} value={current.value} onChange={(e) => onChange(initialValue(options.find((o) => o.value === e.target.value)!.info))}>
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.info.title ?? o.value}
          </option>
        ))}
      </select>
      <div className="mt-2">
        <Field name={name} path={path} info={current.info} value={obj} onChange={onChange} errors={errors} skip={new Set([discriminator])} bare />
      </div>
      <Hint text={help} />
    </fieldset>
  );
}
