// ProjectFileError: the one error type of the project store. It names the file and says, in
// words a user can act on, why the file was refused or could not be written.

export class ProjectFileError extends Error {
  override name = 'ProjectFileError';
  /** The project file (or temp/backup file) concerned. */
  readonly path: string;
  /** The reason alone, without the path: "damaged: integrity check failed: ...". */
  readonly reason: string;

  constructor(path: string, reason: string, options?: { cause?: unknown }) {
    super(`${path}: ${reason}`, options);
    this.path = path;
    this.reason = reason;
  }
}

/** The message of any thrown value, for wrapping foreign errors. */
export function messageOf(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}
