// Property tests run from a fixed seed so that CI is repeatable; FC_SEED=random explores new cases
// (and FC_SEED=<number> replays one), which is how a counterexample is hunted down locally.
import fc from "fast-check";

const seed = process.env.FC_SEED;
if (seed !== "random") fc.configureGlobal({ seed: seed ? Number(seed) : 20_261_201 });
