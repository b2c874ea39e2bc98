/**
 * Words the pane, the plan and Compare sheets and the CLI all show for the same concept, so
 * each has one name everywhere (test/sheets/displayNames.test.ts checks the pane, the sheets
 * and the CLI against this table). Schedule and rule names are in `settingFields.ts`
 * (`SCHEDULE_NAMES`, `RULE_NAMES`) beside the settings they name.
 */
export const TERMS = {
  /** Stops the plan does not serve, for whatever reason. */
  unassigned: "Unassigned",
  /** Stops without a Priority (so they must be served) that the plan still does not serve. */
  mustServeLeftOut: "Must-serve left out",
  /**
   * The action that plans: the pane's button and step heading, the ribbon button
   * (manifest.xml `Kiln.OpenPane.Label`); the CLI's command is its verb, `kiln plan`.
   */
  planAction: "Plan routes",
} as const;
