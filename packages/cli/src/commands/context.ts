import type { Paint } from "../color.js";
import type { CliIo } from "../io.js";
import type { Progress } from "../progress.js";

/** What every command gets: the streams, the output settings and somewhere to put notes. */
export interface CommandContext {
  readonly io: CliIo;
  readonly json: boolean;
  readonly quiet: boolean;
  /** Colours for the report on stdout, and for messages on stderr. */
  readonly paintOut: Paint;
  readonly paintErr: Paint;
  readonly progress: Progress;
  /** A line for standard error, dropped under --quiet. */
  readonly note: (text: string) => void;
  /** `place: warning: message` on standard error, dropped under --quiet. */
  readonly warn: (place: string, message: string) => void;
  /** Source texts of the file being worked on, so errors raised later still show their line. */
  sources: ReadonlyMap<string, string>;
}
