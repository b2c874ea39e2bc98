import type { Issue } from "../core/index.js";

/**
 * One line for an issue: "Sheet!E7: message" (the message already names the fix). A message
 * that already starts with its sheet is printed as is.
 *
 * @param issue - a user-data issue
 * @returns the line, without a newline
 * @example formatIssue({ sheet: "Stops", cell: "E7", message: "latitude 123.4 is outside -90..90" }) // => "Stops!E7: latitude 123.4 is outside -90..90"
 */
export function formatIssue(issue: Issue): string {
  if (issue.message.startsWith(`${issue.sheet}!`) || issue.message.startsWith(`${issue.sheet}:`)) return issue.message;
  if (issue.cell === "") return `${issue.sheet}: ${issue.message}`;
  if (/^\$?[A-Z]{1,3}\$?\d+(:\$?[A-Z]{1,3}\$?\d+)?$/.test(issue.cell)) return `${issue.sheet}!${issue.cell}: ${issue.message}`;
  return `${issue.sheet} (${issue.cell}): ${issue.message}`;
}
