/** Export tasks for the worker pool (registered in src/worker.ts): a whole float32 field file, written and hashed on the worker. */
import { writeFieldFile } from './field-file.js';

/** Task name -> function: writeFieldFile (file, header, values, force) -> sha256 and size. */
export const EXPORT_TASKS = {
  exportFieldFile: writeFieldFile,
};
