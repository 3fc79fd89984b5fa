/**
 * The gates a build or a screening run sets (`--fail-on`, `--max-risk`): the one place they are evaluated,
 * for `check` on files, `check --records` and `sweep` alike.
 */
import { levelRank, type Level } from "./types.js";

export interface Gates {
  /** A finding at or above this level trips the gate. */
  failOn?: Level;
  /** A risk above this probability trips the gate. */
  maxRisk?: number;
}

/** What a gate looks at in one judged app: its most severe finding, and its risk. */
export interface Gated {
  worst?: Level;
  risk?: number;
}

/** The gates as given, without the ones left unset. */
export function gatesOf(o: { failOn?: Level; maxRisk?: number }): Gates {
  return { ...(o.failOn ? { failOn: o.failOn } : {}), ...(o.maxRisk !== undefined ? { maxRisk: o.maxRisk } : {}) };
}

/** The most severe of some levels (undefined for none). */
export function worstOf(levels: Iterable<Level>): Level | undefined {
  let worst: Level | undefined;
  for (const l of levels) if (worst === undefined || levelRank(l) > levelRank(worst)) worst = l;
  return worst;
}

/** Whether one app trips a gate. */
export function tripsGate(app: Gated, gates: Gates): boolean {
  if (gates.failOn !== undefined && app.worst !== undefined && levelRank(app.worst) >= levelRank(gates.failOn)) return true;
  return gates.maxRisk !== undefined && app.risk !== undefined && app.risk > gates.maxRisk;
}
