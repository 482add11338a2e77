/**
 * Zod issues (from the client's parse or the server's 400 details) turned into one message per form field.
 * A union of sources fails as one `invalid_union` issue holding every branch's issues; the branch whose
 * `kind` matched is the one the author meant, so its issues are lifted out with the union's path prefixed.
 */
import type { FieldErrors, Resolver } from "react-hook-form";
import { CreateDesignSchema } from "@shared/schemas/designs";
import type { DesignFormValues } from "./form-values";
import { API_WORDS, friendlyMessage, generatorMessage } from "@/lib/friendly-message";
import { formPathOf, toCreateInput } from "./to-create-input";

export { friendlyMessage, generatorMessage };

/** The part of a zod issue this module reads. */
export interface IssueLike {
  path: ReadonlyArray<PropertyKey>;
  message: string;
  code?: string;
  errors?: ReadonlyArray<ReadonlyArray<IssueLike>>;
}

const isKindIssue = (i: IssueLike) => i.path.length === 1 && i.path[0] === "kind";

/** Issues with unions resolved to their matching branch. */
export function flattenIssues(issues: ReadonlyArray<IssueLike>): IssueLike[] {
  const out: IssueLike[] = [];
  for (const issue of issues) {
    if (issue.code === "invalid_union" && issue.errors?.length) {
      const branch = issue.errors.find((b) => !b.some(isKindIssue)) ?? issue.errors[0]!;
      out.push(...flattenIssues(branch.map((i) => ({ ...i, path: [...issue.path, ...i.path] }))));
    } else out.push(issue);
  }
  return out;
}

/**
 * A whole-source issue (path ends at `content.tx` / `content.fir`) belongs to the parameter its message starts
 * with: the generators name the offending parameter first ("sampleRateHz (…) must be ≥ …").
 */
function atNamedParameter(issue: IssueLike): IssueLike {
  const p = issue.path;
  if (p.length !== 2 || p[0] !== "content" || (p[1] !== "tx" && p[1] !== "fir")) return issue;
  const first = /^([a-zA-Z]+)\b/.exec(issue.message)?.[1];
  if (!first || !(first in API_WORDS)) return issue;
  return { ...issue, path: [...p, first], message: generatorMessage(issue.message) };
}

/** First message per form field for the given issues. */
export function fieldMessages(
  values: DesignFormValues,
  issues: ReadonlyArray<IssueLike>,
): Record<string, string> {
  const out: Record<string, string> = {};
  for (const flat of flattenIssues(issues)) {
    const issue = atNamedParameter(flat);
    const key = formPathOf(
      values,
      issue.path.filter((p): p is string | number => typeof p !== "symbol"),
    );
    if (!(key in out)) out[key] = friendlyMessage(issue);
  }
  return out;
}

function setPath(target: Record<string, unknown>, path: string, value: unknown): void {
  const parts = path.split(".");
  let node = target;
  for (const p of parts.slice(0, -1)) {
    if (typeof node[p] !== "object" || node[p] === null) node[p] = {};
    node = node[p] as Record<string, unknown>;
  }
  node[parts[parts.length - 1]!] = value;
}

/** Nested react-hook-form errors from flat `field.path → message` pairs. */
export function toFieldErrors(messages: Record<string, string>): FieldErrors<DesignFormValues> {
  const errors: Record<string, unknown> = {};
  for (const [path, message] of Object.entries(messages))
    setPath(errors, path, { type: "validate", message });
  return errors as FieldErrors<DesignFormValues>;
}

/** react-hook-form resolver: map the form to the API body and validate it with the server's CreateDesignSchema. */
export const createDesignResolver: Resolver<DesignFormValues> = (values) => {
  const parsed = CreateDesignSchema.safeParse(toCreateInput(values));
  if (parsed.success) return { values, errors: {} };
  return { values: {}, errors: toFieldErrors(fieldMessages(values, parsed.error.issues as IssueLike[])) };
};
