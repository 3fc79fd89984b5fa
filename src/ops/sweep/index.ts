export { sweep, type SweepOptions, type SweepSummary } from "./sweep.js";
export { listInputs, parseShard, shardOf } from "./inputs.js";
export { scoreInput, SWEEP_SCHEMA_VERSION, type SweepInput, type SweepRow } from "./rows.js";
