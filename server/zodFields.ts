// A zod error as the field errors our answers carry: each field named, in words.
import type { ZodError } from 'zod';
import type { FieldError } from './errors';
import { fieldLabel, RAW_SCHEMA_TEXT } from '../shared/schemas/errorMap';

export function zodFields(err: ZodError): FieldError[] {
  return err.issues.map((i) => {
    const path = i.path.join('.');
    const keys = i.code === 'unrecognized_keys' ? ((i as { keys?: string[] }).keys ?? []) : [];
    // Belt and braces: a message zod wrote itself never reaches a person.
    const message = RAW_SCHEMA_TEXT.test(i.message) ? 'is not valid' : i.message;
    return {
      path: path || keys.join(', ') || '(body)',
      message,
      label: keys.length && !path ? 'This form' : fieldLabel(i.path),
    };
  });
}
