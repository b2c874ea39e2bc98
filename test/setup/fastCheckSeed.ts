import fc from "fast-check";

// Property tests run on one fixed seed so that a run on CI repeats a run on a developer's machine;
// set FC_SEED to explore other inputs (a failure prints its seed and counterexample).
fc.configureGlobal({ seed: Number(process.env.FC_SEED ?? 20261201) });
