// Zod's own messages ("Too small: expected number to be >0") are for developers. This map words every issue a
// schema does not word itself as a short predicate ("must be greater than 0"), so that one function
// (shared/field-messages.ts) can put the field's name in front: "Overhang must be greater than 0".
import { z } from "zod";
import { formatNumber } from "../format.js";

type Issue = Parameters<NonNullable<z.core.$ZodConfig["customError"]>>[0];

const typeNames: Record<string, string> = {
  number: "a number",
  int: "a whole number",
  string: "text",
  boolean: "yes or no",
  array: "a list",
  object: "a group of values",
  date: "a date",
};

const formatNames: Record<string, string> = {
  email: "an e-mail address",
  uuid: "a valid id",
  guid: "a valid id",
  date: "a date as YYYY-MM-DD",
  datetime: "a date and time (ISO 8601)",
  time: "a time as HH:MM",
  url: "a web address",
  regex: "in the expected form",
};

function bound(n: number | bigint): string {
  return typeof n === "bigint" ? n.toString() : formatNumber(n, 6);
}

function unitFor(origin: string, n: number | bigint): string {
  const one = Number(n) === 1;
  if (origin === "string") return one ? " character" : " characters";
  if (origin === "array" || origin === "set") return one ? " item" : " items";
  if (origin === "file") return " bytes";
  return "";
}

/** A plain-words predicate for one zod issue (no field name; the caller adds it). */
export function issuePredicate(issue: Issue): string | undefined {
  switch (issue.code) {
    case "invalid_type":
      if (issue.input === undefined || issue.input === null) return "is required";
      return `must be ${typeNames[issue.expected] ?? issue.expected}`;
    case "too_small": {
      const unit = unitFor(issue.origin, issue.minimum);
      if (issue.origin === "string" && Number(issue.minimum) === 1) return "is required";
      if (issue.origin === "array" && Number(issue.minimum) === 1) return "needs at least one item";
      if (issue.exact) return `must be exactly ${bound(issue.minimum)}${unit}`;
      return issue.inclusive === false
        ? `must be greater than ${bound(issue.minimum)}${unit}`
        : `must be at least ${bound(issue.minimum)}${unit}`;
    }
    case "too_big": {
      const unit = unitFor(issue.origin, issue.maximum);
      if (issue.exact) return `must be exactly ${bound(issue.maximum)}${unit}`;
      return issue.inclusive === false
        ? `must be less than ${bound(issue.maximum)}${unit}`
        : `must be at most ${bound(issue.maximum)}${unit}`;
    }
    case "invalid_format":
      return `must be ${formatNames[issue.format] ?? "in the expected form"}`;
    case "not_multiple_of":
      return Number(issue.divisor) === 1 ? "must be a whole number" : `must be a multiple of ${bound(issue.divisor)}`;
    case "invalid_value":
      return issue.values.length === 1 ? `must be ${String(issue.values[0])}` : `must be one of: ${issue.values.map(String).join(", ")}`;
    case "unrecognized_keys":
      return `has unknown ${issue.keys.length === 1 ? "field" : "fields"}: ${issue.keys.join(", ")}`;
    case "invalid_union":
      return "is not in an accepted form";
    case "invalid_key":
      return "has a name that is not accepted";
    default:
      return undefined;
  }
}

z.config({ customError: (issue) => issuePredicate(issue) });
