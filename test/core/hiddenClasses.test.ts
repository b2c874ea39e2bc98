import { setFlagsFromString } from "node:v8";
import { describe, expect, it } from "vitest";
import { compileProblem } from "../../src/core/schedule/compileProblem.js";
import { randomInstance } from "./randomInstance.js";

// The hot loops read the compiled problem at every move; V8 keeps a read fast while the objects
// it sees share one hidden class ("map"), and turns it megamorphic (a dictionary lookup) once it
// has seen more than four (V8's inline caches: https://v8.dev/blog/fast-properties and
// https://mathiasbynens.be/notes/shapes-ics). %HaveSameMap is V8's own runtime test for it,
// reachable once --allow-natives-syntax is set.
setFlagsFromString("--allow-natives-syntax");
const haveSameMap = new Function("a", "b", "return %HaveSameMap(a, b)") as (a: unknown, b: unknown) => boolean;

describe("compiled problems share one hidden class", () => {
  it("across compilations of one problem and of problems of other sizes and rules", () => {
    const small = randomInstance(1, { stops: 12, vehicles: 3 });
    const large = randomInstance(2, { stops: 40, vehicles: 5, optional: true, multiWindow: true });
    const compiled = [compileProblem(small), compileProblem(small), compileProblem(large), compileProblem(small)];
    for (let i = 1; i < compiled.length; i++) expect(haveSameMap(compiled[0], compiled[i])).toBe(true);
  });
});
