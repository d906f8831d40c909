/**
 * The one answer an action gives when it cannot accept a form (status 400, or
 * 401/403/409/410/429 where that says more). Pages show `formError` above the
 * form and each `fieldErrors` entry beside its field.
 */
export type FormFailure = {
  ok: false;
  /** Which form failed, on pages that carry several (the form's `intent`). */
  intent?: string;
  /** A message about the whole form. */
  formError?: string;
  /** One message per field, by field name. */
  fieldErrors?: Record<string, string>;
  /** What was typed (never a password), so a page without JavaScript keeps it. */
  values?: Record<string, string>;
};

/** The failure of one form on a page with several: `answer` when it came from the form with this `intent`. */
export function failureOf(answer: unknown, intent?: string): FormFailure | null {
  if (!answer || typeof answer !== "object" || (answer as { ok?: unknown }).ok !== false) return null;
  const failure = answer as FormFailure;
  return intent === undefined || failure.intent === intent ? failure : null;
}

/** The one line to show for a failure: the form's message, else the first field's. */
export function failureMessage(failure: FormFailure | null | undefined): string | null {
  if (!failure) return null;
  return failure.formError ?? Object.values(failure.fieldErrors ?? {})[0] ?? null;
}
