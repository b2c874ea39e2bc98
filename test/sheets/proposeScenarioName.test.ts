import { describe, expect, it } from "vitest";
import { proposeScenarioName } from "../../src/sheets/proposeScenarioName.js";

// Expected names are hand-worked from Excel's sheet-name rule that names are unique ignoring
// case (Microsoft support, "Rename a worksheet"; from memory) and the pane's "Plan N" default.
describe("proposeScenarioName: the name offered for the next run", () => {
  it('a rerun of "Plan 1" proposes "Plan 2", not a name that lands as "Plan 1 (2)"', () => {
    expect(proposeScenarioName("Plan 1", ["Stops", "Fleet", "Plan 1", "Plan 1 routes", "Compare"])).toBe("Plan 2");
  });

  it("takes the first free number, ignoring case and the route sheets", () => {
    expect(proposeScenarioName("Plan 4", ["PLAN 1", "plan 2", "Plan 2 routes", "Plan 4"])).toBe("Plan 3");
    expect(proposeScenarioName("Plan 7", ["Stops"])).toBe("Plan 1");
  });

  it('a blank field gets "Plan N" too', () => {
    expect(proposeScenarioName("  ", ["Plan 1"])).toBe("Plan 2");
  });

  it("keeps a typed name while no sheet has it, exactly as typed", () => {
    expect(proposeScenarioName("Monday late vans", ["Plan 1", "Monday"])).toBe("Monday late vans");
    expect(proposeScenarioName("Mon 1/12", [])).toBe("Mon 1/12");
  });

  it("offers the name the plan sheet would get once a sheet has the typed name", () => {
    expect(proposeScenarioName("Monday", ["monday"])).toBe("Monday (2)");
    expect(proposeScenarioName("Monday", ["Monday", "Monday (2)"])).toBe("Monday (3)");
    // "/" is not allowed in a sheet name and becomes "-": the sheet "Mon 1-12" is the same name.
    expect(proposeScenarioName("Mon 1/12", ["Mon 1-12"])).toBe("Mon 1-12 (2)");
  });
});
