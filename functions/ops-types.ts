/** Progress callback handed to the engine: fraction done; return true to cancel. */
export type Progress = (fraction: number) => boolean | void;
