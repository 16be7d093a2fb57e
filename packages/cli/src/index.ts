/**
 * The `onset` command line as a library: `runCli` runs a command line against given streams;
 * the formatting and plotting helpers the reports use are exported too.
 * @packageDocumentation
 */
export { runCli } from "./cli.js";
export type { CliIo } from "./io.js";
export { processIo } from "./io.js";
export { EXIT } from "./exit.js";
export type { ExitStatus } from "./exit.js";
export { CliError } from "./cli-error.js";
export { parseArgs, valueOf } from "./args.js";
export type { OptionSpec, ParsedArgs } from "./args.js";
export { COMMANDS } from "./commands/table.js";
export type { CommandSpec } from "./commands/table.js";
// writeFileAtomic is the earlier name of writeOutputFile: regular files are still replaced
// atomically, but pipes, devices and links are now written safely instead of replaced.
export { writeOutputFile, writeOutputFile as writeFileAtomic, writeOutput, openOutput } from "./output/write.js";
export type { OutputStream } from "./output/write.js";
export { outputTarget } from "./output/target.js";
export type { OutputTarget } from "./output/target.js";
export { numberedPath } from "./output-files.js";
export { csvDocument, csvField, csvNumber } from "./csv/csv.js";
export { readResults } from "./study/results-file.js";
export type { CutLine, ResultsContent } from "./study/results-file.js";
export type { StoredSample, StudyHeader, WindowSweep } from "./study/header.js";
export { predictedStartupTime } from "./report/prediction.js";
export * from "./format/index.js";
export * from "./plot/index.js";
