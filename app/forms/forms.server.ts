import { data, redirect } from "react-router";
import type { z } from "zod";
import type { FlashTone } from "~/utils/flashTone";
import { flashHeader } from "~/server/flash.server";
import type { FormFailure } from "./failure";

/**
 * One way to answer a form: `parseForm` reads it with a zod schema (for pages with
 * several forms, a `z.discriminatedUnion("intent", …)`), `formFailure` answers what
 * cannot be accepted in the one shape of `FormFailure`, and `redirectWithFlash`
 * moves on with a message for the next page.
 */

/** Form values to send back on error so nothing typed is lost (passwords never). */
export function keptValues(form: FormData): Record<string, string> {
  const values: Record<string, string> = {};
  for (const [key, value] of form) {
    if (typeof value === "string" && !/password/i.test(key)) values[key] = value;
  }
  return values;
}

/** The form's fields as a plain object for zod; a field sent more than once becomes a list. */
export function formFields(form: FormData): Record<string, unknown> {
  const raw: Record<string, unknown> = {};
  for (const key of new Set(form.keys())) {
    const all = form.getAll(key);
    raw[key] = all.length > 1 ? all : all[0];
  }
  return raw;
}

type FailureInit = {
  /** The form as posted: its `intent` and what was typed go back with the answer. */
  form?: FormData;
  formError?: string;
  fieldErrors?: Record<string, string>;
  status?: number;
  headers?: HeadersInit;
};

/** The answer for a form that cannot be accepted (400 unless told). */
export function formFailure({ form, formError, fieldErrors, status = 400, headers }: FailureInit) {
  const intent = form?.get("intent");
  const body: FormFailure = {
    ok: false,
    ...(typeof intent === "string" ? { intent } : {}),
    ...(formError !== undefined ? { formError } : {}),
    ...(fieldErrors !== undefined ? { fieldErrors } : {}),
    ...(form ? { values: keptValues(form) } : {}),
  };
  return data(body, { status, headers });
}

/**
 * Reads a form with a zod schema. On failure, the 400 answer: the first message per
 * field beside it, an unknown `intent` (or a rule about the whole form) as `formError`.
 */
export function parseForm<S extends z.ZodType>(
  schema: S,
  form: FormData,
): { ok: true; data: z.output<S> } | { ok: false; response: ReturnType<typeof formFailure> } {
  const result = schema.safeParse(formFields(form));
  if (result.success) return { ok: true, data: result.data };
  const fieldErrors: Record<string, string> = {};
  let formError: string | undefined;
  for (const issue of result.error.issues) {
    const key = issue.path[0];
    if (key === "intent") formError ??= "Unknown action.";
    else if (key === undefined) formError ??= issue.message;
    else fieldErrors[String(key)] ??= issue.message;
  }
  return {
    ok: false,
    response: formFailure({ form, formError, fieldErrors: Object.keys(fieldErrors).length ? fieldErrors : undefined }),
  };
}

type FlashInit = { tone?: FlashTone; headers?: HeadersInit };

/** Redirects to `url` and shows `message` once there (a success unless `tone` says otherwise). */
export async function redirectWithFlash(
  url: string,
  message: string,
  request: Request,
  { tone = "success", headers }: FlashInit = {},
) {
  const all = new Headers(headers);
  all.append("Set-Cookie", await flashHeader(request, { tone, message }));
  return redirect(url, { headers: all });
}

/** Answers `value` on the same page and shows `message` once (for forms that stay where they are). */
export async function dataWithFlash<T>(
  value: T,
  message: string,
  request: Request,
  { tone = "success", headers }: FlashInit = {},
) {
  const all = new Headers(headers);
  all.append("Set-Cookie", await flashHeader(request, { tone, message }));
  return data(value, { headers: all });
}

/**
 * The posted form. A body that cannot be read as a form (a broken multipart part, a
 * wrong content type) is the client's error: 400, never a 500.
 */
export async function readForm(request: Request): Promise<FormData> {
  try {
    return await request.formData();
  } catch {
    throw data("The form could not be read. Send it again from the page.", { status: 400 });
  }
}
