/**
 * Reading circuit files from the file system (Node only): `readSource` for a file and its
 * includes, `fileReader` for the include reader itself, confined to chosen folders.
 * @packageDocumentation
 */
export { displayName, fileReader, readRegularFile, readSource } from "./node-door.js";
export type { ReadSourceOptions } from "./files/read-source.js";
export { STDIN_NAME } from "./files/file-reader.js";
export type { FileReaderOptions } from "./files/file-reader.js";
