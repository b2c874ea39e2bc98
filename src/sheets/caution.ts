/**
 * The caution line every scenario sheet, the pane and the README carry. Routes are driven
 * by people on real roads: the plan is an estimate, not an instruction.
 *
 * @example grid.values[1][0] === CAUTION_TEXT
 */
export const CAUTION_TEXT =
  "Caution: kilometres and times are estimates from straight-line distances times a detour factor, " +
  "not from roads. Before dispatch, check the roads, vehicle restrictions and legal driving and rest " +
  "hours; local regulations and company rules prevail over this plan.";
