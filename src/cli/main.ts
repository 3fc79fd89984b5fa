/**
 * The `overask` command: commander wiring only. Each command parses its options (typed parsers in
 * options.ts), calls an operation from src/ops, picks a formatter and sets the exit code. Command modules
 * load when their command runs, so that `--help` and `--version` start fast.
 */
import { describeForCli } from "./hints.js";
import { Command, CommanderError, Option } from "commander";
import { OutputError, OveraskError, UsageError } from "../errors.js";
import { TOOL_VERSION } from "../version.js";
import { kindsInWords } from "../extract/kinds.js";
import { EXIT, exitCodesHelp } from "./exit-codes.js";
import { processIo, type Io } from "./io.js";
import { anInteger, closedUnit, collect, collectLevels, collectPairs, nonNegative, openUnit, shardParser, wholeNumber } from "./options.js";

export type { Io } from "./io.js";

/** What a command's action does with its exit code. */
type SetExit = (code: number) => void;

/** Runs the CLI with `argv` (without the node and script entries) and returns the exit code. */
export async function run(argv: string[], io: Io = processIo): Promise<number> {
  let exitCode: number = EXIT.OK;
  const debug = argv.includes("--debug");
  const program = buildProgram(io, debug, (code) => (exitCode = code));
  try {
    await program.parseAsync(argv, { from: "user" });
  } catch (e) {
    return exitCodeOf(e, io, debug);
  }
  return exitCode;
}

/** The program: every command with its options. */
function buildProgram(io: Io, debug: boolean, setExit: SetExit): Command {
  const program = new Command()
    .name("overask")
    .description("Read Android manifests and weigh the permissions they request against apps of the same category.")
    .version(TOOL_VERSION, "-V, --version")
    .option("--debug", "print stack traces for errors")
    .showHelpAfterError("(run overask --help for usage)")
    // Argument errors read like every other error: `overask: <problem>`.
    .configureOutput({ writeOut: (s) => io.stdout.write(s), writeErr: (s) => io.stderr.write(s), outputError: (s, write) => write(`overask: ${s.replace(/^error: /, "")}`) })
    .addHelpText("after", exitCodesHelp())
    .exitOverride();
  addFacts(program, io, debug, setExit);
  addLearn(program, io, setExit);
  addCheck(program, io, setExit);
  addSweep(program, io, setExit);
  addWork(program, io, setExit);
  addTrim(program, io, setExit);
  addDelta(program, io, setExit);
  addBaseline(program, io, setExit);
  addRules(program, io, setExit);
  addFold(program, io, setExit);
  return program;
}

/**
 * The options every judging command shares (check, sweep, trim, delta): which category, which baseline,
 * which checks at which level, the prevalence, policies, and whether to read the code.
 */
function withJudgingOptions(cmd: Command, category = "category to judge against (otherwise --categories, then android:appCategory, then all categories pooled)"): Command {
  return cmd
    .option("-c, --category <name>", category)
    .option("--categories <file>", "CSV mapping package names to categories (package,category)")
    .option("-b, --baseline <file>", "baseline file (default: the bundled baselines/default.json)")
    .option("--level <check=level>", "override a check's level: error, warning, note or off (repeatable)", collectLevels)
    .option("--prevalence <share>", "share of flagged apps in your population: shift the risk to it from the training base rate", openUnit)
    .option("--policy <file>", "evaluate this policy's rules too (repeatable; see overask rules)", collect)
    .option("--no-code", "skip reading the app's dex code for code evidence (APKs and bundles)");
}

/** The gates of check and sweep. */
function withGates(cmd: Command, what: string): Command {
  return cmd
    .addOption(new Option("--fail-on <level>", `exit 1 when ${what} a finding at or above this level`).choices(["error", "warning", "note"]))
    .option("--max-risk <p>", "exit 1 when an app's risk is above this probability (0.3 or 30%)", closedUnit);
}

const formatOption = (formats: string[]) => new Option("-f, --format <format>", "output format").choices(formats).default(formats[0]);

function addFacts(program: Command, io: Io, debug: boolean, setExit: SetExit): void {
  program
    .command("facts")
    .description("read APKs, app bundles or manifests and print what they declare")
    .argument("<file...>", `apps or manifests: ${kindsInWords()}`)
    .addOption(formatOption(["text", "json"]))
    .option("--no-code", "skip reading the app's dex code for code evidence")
    .action(async (files: string[], opts: { format: "text" | "json"; code: boolean }) => {
      const { factsCommand } = await import("./facts-command.js");
      setExit(factsCommand(files, opts, io, debug));
    });
}

function addLearn(program: Command, io: Io, setExit: SetExit): void {
  program
    .command("learn")
    .description("learn category baselines (and a risk model, from labeled apps) from corpora")
    .argument("<corpus...>", "corpora for category frequencies: JSONL, wide 0/1 CSV, or an index CSV of APKs/manifests (file,category[,label])")
    .requiredOption("-o, --output <file>", "baseline file to write")
    .addOption(new Option("--format <format>", "corpus format (default: told from the content)").choices(["jsonl", "wide-csv", "files"]))
    .option("--id-field <name>", "field or column with the app id")
    .option("--category-field <name>", "field or column with the category")
    .option("--permissions-field <name>", "JSONL field with the list of permissions")
    .option("--label-field <name>", "field (JSONL) or column (CSV) with the label")
    .option("--label-column <name>", "the same as --label-field")
    .option("--positive <value>", "label value meaning flagged (repeatable; default 1 and true)", collect)
    .option("--columns-from <file>", "wide CSV: file listing the permission columns (first CSV column)")
    .option("--columns-kind <kind>", "wide CSV: keep only columns whose second field in --columns-from is this")
    .option("--licence <text>", "licence of the frequency corpora, recorded in the baseline")
    .option("--labels <file>", "separate labeled corpus for the risk model (same field options)")
    .option("--labels-licence <text>", "licence of the labeled corpus")
    .option("--labels-name <text>", "how risk statements name the labeled corpus (default: its path)")
    .option("--labels-citation <text>", "the labeled corpus's full citation, kept in the baseline's provenance")
    .option("--corpus-years <years>", "when the frequency corpus's apps were collected (e.g. 2020), recorded with the baseline's era")
    .option("--validate <corpus>", "a labeled corpus the model never sees in training, scored after it and recorded in the baseline (repeatable)", collect)
    .option("--validate-name <text>", "how outputs name each --validate corpus, in order (repeatable)", collect)
    .option("--validate-label-field <name>", "label field or column of the --validate corpora (default: --label-field)")
    .option("--validate-positive <value>", "label value meaning flagged in the --validate corpora (repeatable; default: --positive)", collect)
    .option("--validate-licence <text>", "licence of the --validate corpora, recorded in the baseline")
    .option("--alias <from=to>", "category alias, e.g. Educational=Education (repeatable)", collectPairs)
    .addOption(new Option("--prior <method>", "shrinkage toward the pooled rate").choices(["fixed", "empirical-bayes"]).default("fixed"))
    .option("--prior-strength <n>", "fixed: pooled pseudo-apps per category; empirical-bayes: the cap", nonNegative, 10)
    .option("--confidence <level>", "confidence level of the Wilson intervals", openUnit, 0.95)
    .option("--min-support <n>", "categories with fewer apps use the pooled baseline", wholeNumber(0), 30)
    .option("--uncommon-below <rate>", "uncommon: the interval's upper end is below this rate", openUnit, 0.05)
    .option("--seed <n>", "seed for sampling and cross-validation folds", anInteger, 1)
    .option("--folds <k>", "cross-validation folds", wholeNumber(2), 5)
    .option("--max-train-rows <n>", "train on a seeded stratified sample above this many labeled rows", wholeNumber(10), 200000)
    .option("--reject-limit <share>", "fail when a corpus rejects more than this share of its rows", closedUnit, 0.05)
    .option("--rejects <file>", "write every rejected row (file, line, reason) to this file")
    .action(async (corpora: string[], o: import("./learn-command.js").LearnCliOptions) => {
      const { learnCommand } = await import("./learn-command.js");
      setExit(await learnCommand(corpora, o, io));
    });
}

function addCheck(program: Command, io: Io, setExit: SetExit): void {
  withGates(withJudgingOptions(program.command("check")), "there is")
    .addOption(formatOption(["text", "json", "sarif", "html"]))
    .description("judge apps against their category's baseline: uncommon permissions, other checks, and the risk estimate")
    .argument("[file...]", `apps or manifests: ${kindsInWords()}`)
    .option("--records <corpus>", "score pre-extracted records (JSONL, wide CSV) instead of files: one JSON line per record")
    .option("--id-field <name>", "with --records: field or column with the app id")
    .option("--category-field <name>", "with --records: field or column with the category")
    .option("--permissions-field <name>", "with --records: JSONL field with the permissions")
    .option("--columns-from <file>", "with --records: wide CSV permission columns")
    .option("--columns-kind <kind>", "with --records: keep columns of this kind")
    .action(async (files: string[], o: import("./check-command.js").CheckCliOptions) => {
      const { checkCommand } = await import("./check-command.js");
      setExit(await checkCommand(files, o, io));
    });
}

function addSweep(program: Command, io: Io, setExit: SetExit): void {
  withGates(withJudgingOptions(program.command("sweep"), "category for every input (otherwise the index CSV's, then android:appCategory)"), "an app has")
    .description("screen an inventory: every APK, bundle or manifest under a folder, in a list, or in an index CSV")
    .argument("<source>", "a folder, a list of files (one a line), or an index CSV (file,category)")
    .requiredOption("-o, --output <file>", "results file (one row per input)")
    .addOption(new Option("-f, --format <format>", "results format").choices(["jsonl", "csv"]).default("jsonl"))
    .option("--html <file>", "also write a self-contained HTML report")
    .option("-j, --jobs <n>", "worker threads (default: the number of cores)", wholeNumber(1))
    .option("--resume", "continue an interrupted run: skip inputs already in the results with the same size and time")
    .option("--shard <i/n>", "process the i-th of n stable parts of the inputs (for several machines)", shardParser)
    .option("--queue <redis-url>", "spread the inputs over workers through a Redis queue: redis[s]://host:port/<queue name> (workers run overask work)")
    .option("--clear-queue", "with --queue: drop another sweep's jobs found in the queue instead of refusing")
    .action(async (source: string, o: import("./sweep-command.js").SweepCliOptions) => {
      const { sweepCommand } = await import("./sweep-command.js");
      setExit(await sweepCommand(source, o, io));
    });
}

function addWork(program: Command, io: Io, setExit: SetExit): void {
  program
    .command("work")
    .description("take a queued sweep's jobs (from sweep --queue) until stopped; run it on any number of machines that can read the inputs")
    .argument("<redis-url>", "the queue: redis[s]://[user[:password]@]host:port/<queue name> (password also from OVERASK_REDIS_PASSWORD)")
    .option("-j, --jobs <n>", "worker threads (default: the number of cores)", wholeNumber(1))
    .option("-b, --baseline <file>", "baseline file: the same as the producer's (default: the bundled baselines/default.json)")
    .option("--drain", "stop once the queue has nothing left to run")
    .option("--grace <seconds>", "on SIGINT/SIGTERM, wait this long for the jobs in hand and a clean close, then exit anyway (default 8)", nonNegative)
    .action(async (url: string, o: import("./work-command.js").WorkCliOptions) => {
      const { workCommand } = await import("./work-command.js");
      setExit(await workCommand(url, o, io));
    });
}

function addTrim(program: Command, io: Io, setExit: SetExit): void {
  withJudgingOptions(program.command("trim"))
    .addOption(formatOption(["text", "json"]))
    .description("for developers: permissions worth removing, most risk-lowering first, with the manifest change")
    .argument("<file>", "the app's AndroidManifest.xml (source or merged) or APK")
    .option("--merge-report <file>", "the build's manifest-merger report, to name the library that adds each permission")
    .option("--source <file>", "the app's source AndroidManifest.xml, when <file> is an APK or merged manifest")
    .option("--keep <permission>", "leave this permission alone (repeatable)", collect)
    .option("--write <file>", "write a patched copy of the source manifest")
    .option("--in-place", "patch the source manifest itself")
    .option("--remove-used", "with --write/--in-place: also remove permissions the app's code uses (left by default)")
    .action(async (file: string, o: import("./trim-command.js").TrimCliOptions) => {
      const { trimCommand } = await import("./trim-command.js");
      setExit(await trimCommand(file, o, io));
    });
}

function addDelta(program: Command, io: Io, setExit: SetExit): void {
  withGates(withJudgingOptions(program.command("delta")), "the update newly brings")
    .addOption(formatOption(["text", "json"]))
    .description("for reviewers of an update: what changed between two versions of an app")
    .argument("<old>", "the earlier APK or manifest")
    .argument("<new>", "the later APK or manifest")
    .action(async (before: string, after: string, o: import("./delta-command.js").DeltaCliOptions) => {
      const { deltaCommand } = await import("./delta-command.js");
      setExit(await deltaCommand(before, after, o, io));
    });
}

function addBaseline(program: Command, io: Io, setExit: SetExit): void {
  program
    .command("baseline")
    .description("show what a baseline knows: categories, era, provenance; rates for a category or a permission")
    .argument("[file]", "baseline file (default: the bundled baselines/default.json)")
    .option("-c, --category <name>", "list the rate of every permission this category's apps request")
    .option("-p, --permission <name>", "list this permission's rate in every category (bare platform names allowed)")
    .addOption(formatOption(["text", "json"]))
    .action(async (file: string | undefined, o: import("./baseline-command.js").BaselineCliOptions) => {
      const { baselineCommand } = await import("./baseline-command.js");
      setExit(baselineCommand(file, o, io));
    });
}

function addRules(program: Command, io: Io, setExit: SetExit): void {
  program
    .command("rules")
    .description("list the policy rules in force (the given policy files), or the bundled policies, with their sources")
    .option("--policy <file>", "a policy file (repeatable)", collect)
    .addOption(formatOption(["text", "json"]))
    .action(async (o: { policy?: string[]; format: "text" | "json" }) => {
      const { rulesCommand } = await import("./rules-command.js");
      setExit(rulesCommand(o, io));
    });
}

function addFold(program: Command, io: Io, setExit: SetExit): void {
  program
    .command("fold")
    .description("add up baselines learned on separate corpora (counts merge exactly; risk models do not)")
    .argument("<baseline...>", "baseline files")
    .requiredOption("-o, --output <file>", "baseline file to write")
    .action(async (files: string[], o: { output: string }) => {
      const { foldCommand } = await import("./learn-command.js");
      setExit(foldCommand(files, o.output, io));
    });
}

/** The exit code of an error that ended a command, after its one line on stderr. */
function exitCodeOf(e: unknown, io: Io, debug: boolean): number {
  if (e instanceof UsageError) {
    // Some usage errors list several problems (every error of a policy file): one line each.
    io.stderr.write(e.message.split("\n").map((l) => `overask: ${l}\n`).join(""));
    return EXIT.USAGE;
  }
  if (e instanceof CommanderError) {
    // --help and --version end here too, with code 0.
    return e.exitCode === 0 ? EXIT.OK : EXIT.USAGE;
  }
  if (e instanceof OveraskError) {
    io.stderr.write(`overask: ${describeForCli(e)}\n`);
    if (debug && e.stack) io.stderr.write(`${e.stack}\n`);
    // A queue that cannot be reached or used is an input the run could not read (exit-codes.ts).
    return e instanceof OutputError ? EXIT.OUTPUT : EXIT.INPUT;
  }
  io.stderr.write(`overask: internal error: ${(e as Error)?.message ?? String(e)}${debug ? "" : " (rerun with --debug for details)"}\n`);
  if (debug && e instanceof Error && e.stack) io.stderr.write(`${e.stack}\n`);
  return EXIT.INTERNAL;
}
