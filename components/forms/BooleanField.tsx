'use client';
/** An on/off switch; its label is the switch's own words. */
import { Note, shownValue, useFieldText, type FieldProps } from './field-parts';

export function BooleanField(props: FieldProps) {
  const { id, errId, err, title, help } = useFieldText(props);
  return (
    <div>
      <label className="flex items-center gap-2 text-sm">
        <input id={id} type="checkbox" className="accent-tide" checked={shownValue(props) === true} onChange={(e) => props.onChange(e.target.checked)} aria-describedby={err ? errId : undefined} />
        {title}
      </label>
      <Note errId={errId} err={err} help={help} />
    </div>
  );
}
