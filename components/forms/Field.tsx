'use client';
/**
 * One field of a schema-drawn form: picks the control for the field's kind (describe.ts). Each kind has its own
 * file; the ones that hold other fields are handed this component to draw them with.
 */
import type { FieldProps } from './field-parts';
import { ArrayField } from './ArrayField';
import { BooleanField } from './BooleanField';
import { ChoiceField } from './ChoiceField';
import { EnumField } from './EnumField';
import { FieldLabel, useFieldText } from './field-parts';
import { NamePicker } from './NamePicker';
import { NumberField } from './NumberField';
import { ObjectField } from './ObjectField';
import { OptionalGroup } from './OptionalGroup';
import { RecordField } from './RecordField';
import { TextField } from './TextField';
import { TupleField } from './TupleField';
import { VariantsField } from './VariantsField';

/** Groups get an on/off switch when optional; an optional number or text is simply left empty. */
const GROUPS = new Set(['object', 'array', 'record', 'variants']);

export function Field(props: FieldProps) {
  if (props.info.optional && GROUPS.has(props.info.shape.kind)) return <OptionalGroup {...props}>{(inner) => <Field {...inner} />}</OptionalGroup>;
  switch (props.info.shape.kind) {
    case 'literal':
      return null;
    case 'number':
      return <NumberField {...props} />;
    case 'string':
      return props.info.namesOf ? <NamePicker {...props} /> : <TextField {...props} />;
    case 'boolean':
      return <BooleanField {...props} />;
    case 'enum':
      return <EnumField {...props} />;
    case 'tuple':
      return <TupleField {...props} />;
    case 'record':
      return <RecordField {...props} />;
    case 'object':
      return <ObjectField {...props} Field={Field} />;
    case 'array':
      return <ArrayField {...props} Field={Field} />;
    case 'variants':
      return <VariantsField {...props} Field={Field} />;
    case 'choice':
      return <ChoiceField {...props} Field={Field} />;
    default:
      return <Unknown {...props} />;
  }
}

/** A field the schema cannot describe (a custom type with no JSON Schema): named, and kept as it is. */
function Unknown(props: FieldProps) {
  const { title } = useFieldText(props);
  return (
    <div>
      <FieldLabel title={title} />
      <p className="text-xs text-ink-soft">Kept as it is; this form has no control for it.</p>
    </div>
  );
}
