export { sweep, type SweepOptions, type SweepSummary } from "./sweep.js";
export { listInputs, parseShard, shardOf } from "./inputs.js";
export { scoreInput, type SweepInput, type SweepFormat } from "./rows.js";
export { readRows } from "./resume.js";
