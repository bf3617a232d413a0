/**
 * Property tests repeat exactly from run to run (CI must not flip on a lucky draw). Set FC_SEED to
 * another number, or to "random", to explore new cases locally; a failure prints its seed and path.
 */
import fc from "fast-check";

const seedEnv = process.env.FC_SEED ?? "20261202";
if (seedEnv !== "random") fc.configureGlobal({ seed: Number(seedEnv) });
