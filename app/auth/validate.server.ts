import { data } from "react-router";
import type { z } from "zod";

export type FieldErrors = Record<string, string[] | undefined>;

/** Form values to send back on error so nothing typed is lost (passwords never). */
export function keptValues(form: FormData): Record<string, string> {
  const values: Record<string, string> = {};
  for (const [key, value] of form) {
    if (typeof value === "string" && !/password/i.test(key)) values[key] = value;
  }
  return values;
}

export type FormFailure = { ok: false; intent?: string; errors: FieldErrors; formError?: string; values: Record<string, string> };

/** Parses a form with a zod schema; on failure, the 400 answer with errors beside each field. */
export function parseForm<S extends z.ZodType>(
  schema: S,
  form: FormData,
  intent?: string,
): { ok: true; data: z.output<S> } | { ok: false; response: ReturnType<typeof formFailure> } {
  const raw: Record<string, unknown> = {};
  for (const key of new Set(form.keys())) {
    const all = form.getAll(key);
    raw[key] = all.length > 1 ? all : all[0];
  }
  const result = schema.safeParse(raw);
  if (result.success) return { ok: true, data: result.data };
  const errors: FieldErrors = {};
  for (const issue of result.error.issues) {
    const key = String(issue.path[0] ?? "form");
    (errors[key] ??= []).push(issue.message);
  }
  return { ok: false, response: formFailure(form, errors, undefined, intent) };
}

export function formFailure(form: FormData, errors: FieldErrors, formError?: string, intent?: string, status = 400) {
  const body: FormFailure = { ok: false, intent, errors, formError, values: keptValues(form) };
  return data(body, { status });
}
