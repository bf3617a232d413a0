// The client's side of plain-words validation: the same sentences the server sends ("Name is required"),
// from the same mapping (shared/field-messages.ts), for checks the browser runs before submitting.
import type { FieldErrors, Resolver } from "react-hook-form";
import { fieldSentence, issuesToFieldSentences } from "@shared/field-messages";

/** One sentence per field path from a failed `safeParse` (first issue per field wins). */
export function fieldErrorsOf(
  error: { issues: readonly { path: readonly PropertyKey[]; message: string }[] },
  prefix = "",
): Record<string, string> {
  if (!prefix) return issuesToFieldSentences(error.issues);
  return issuesToFieldSentences(error.issues.map((i) => ({ ...i, path: [...prefix.split("."), ...i.path] })));
}

/** A sentence for one field from a predicate or reason the client produced itself. */
export function fieldError(path: string, predicate: string): string {
  return fieldSentence(path, predicate);
}

function reword(errors: FieldErrors, path: string[] = []): void {
  for (const [key, value] of Object.entries(errors)) {
    if (!value || typeof value !== "object") continue;
    const v = value as { message?: unknown; type?: unknown };
    if (typeof v.message === "string" && typeof v.type === "string") v.message = fieldSentence([...path, key].join("."), v.message);
    else reword(value as FieldErrors, [...path, key]);
  }
}

/** Wraps a resolver (`zodResolver(schema)`) so its messages name the field as people see it ("E-mail must be an e-mail address"). */
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- mirrors whatever resolver type zodResolver inferred
export function formResolver<R extends Resolver<any, any, any>>(inner: R): R {
  const call = inner as unknown as (...a: unknown[]) => Promise<{ errors: FieldErrors }> | { errors: FieldErrors };
  const wrapped = async (...args: unknown[]) => {
    const result = await call(...args);
    reword(result.errors);
    return result;
  };
  return wrapped as unknown as R;
}
