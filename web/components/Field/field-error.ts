// A form's refusals, field by field: pure (no DOM), so form-reading modules and components share it.

/** One refusal: the id of the field it belongs to and the sentence shown there. */
export interface FieldError {
  field: string;
  text: string;
}

/** The error sentence for a field id, if any. */
export const errorOf = (errors: readonly FieldError[], field: string): string | undefined => errors.find((e) => e.field === field)?.text;
