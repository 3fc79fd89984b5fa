/** `overask rules`: the policy rules in force, or the bundled policies, with where each rule comes from. */
import { bundledPolicyPaths, readPolicyFile } from "../ops/policy.js";
import { rulesToJson, rulesToText } from "../report/rules.js";
import { pickStyle } from "../report/style.js";
import { EXIT } from "./exit-codes.js";
import type { Io } from "./io.js";

export function rulesCommand(o: { policy?: string[]; format: "text" | "json" }, io: Io): number {
  const given = o.policy?.length ? o.policy : undefined;
  const policies = (given ?? bundledPolicyPaths()).map(readPolicyFile);
  io.stdout.write(o.format === "json" ? rulesToJson(policies, !given) : rulesToText(policies, !given, pickStyle(io.stdout, io.env)));
  return EXIT.OK;
}
