// ProjectStore: a project held in memory, saved as one self-contained SQLite file (save.ts)
// and read back with every check of open.ts. Collections: recordings, models, designs,
// trials, notes.
import packageJson from '../../package.json' with { type: 'json' };
import { Collection } from './collection.ts';
import { resolveLimits, type ProjectLimits } from './limits.ts';
import { saveSnapshot, type SaveOptions, type SaveReport } from './save.ts';
import type { ProjectSnapshot } from './snapshot.ts';
import type { DocumentEntry, NoteEntry, ProjectInfo, RecordingEntry, TrialEntry } from './types.ts';
import {
  checkDocumentEntry, checkNoteEntry, checkRecordingEntry, checkTrialEntry,
  copyDocumentEntry, copyNoteEntry, copyRecordingEntry, copyTrialEntry,
} from './validate.ts';

/** The version of this build, written into each saved file. */
export const APP_VERSION: string = packageJson.version;

/** What openProject found and did. */
export interface OpenReport {
  path: string;
  bytes: number;
  /** Schema version of the file as found on disk. */
  fileSchema: number;
  /** Present when the file was migrated from an older schema. */
  migration?: {
    from: number;
    to: number;
    steps: string[];
    /** Copy of the original file, written before migrating. */
    backupPath: string;
  };
}

export interface CreateOptions {
  limits?: Partial<ProjectLimits>;
  /** Creation time (default: now). */
  now?: Date;
}

export class ProjectStore {
  readonly limits: ProjectLimits;
  readonly recordings: Collection<RecordingEntry>;
  readonly models: Collection<DocumentEntry>;
  readonly designs: Collection<DocumentEntry>;
  readonly trials: Collection<TrialEntry>;
  readonly notes: Collection<NoteEntry>;
  /** Set when the store was read from a file. */
  readonly origin: OpenReport | undefined;
  #info: ProjectInfo;

  private constructor(limits: ProjectLimits, info: ProjectInfo, origin: OpenReport | undefined) {
    const L = limits;
    this.limits = L;
    this.#info = { ...info };
    this.origin = origin;
    this.recordings = new Collection('recording', L.maxRecordings, (v, w) => checkRecordingEntry(v, w, L), copyRecordingEntry);
    this.models = new Collection('model', L.maxDocuments, (v, w) => checkDocumentEntry(v, w, L), copyDocumentEntry);
    this.designs = new Collection('design', L.maxDocuments, (v, w) => checkDocumentEntry(v, w, L), copyDocumentEntry);
    this.trials = new Collection('trial', L.maxDocuments, (v, w) => checkTrialEntry(v, w, L), copyTrialEntry);
    this.notes = new Collection('note', L.maxDocuments, (v, w) => checkNoteEntry(v, w, L), copyNoteEntry);
  }

  /** A new, empty project. */
  static create(options: CreateOptions = {}): ProjectStore {
    const now = (options.now ?? new Date()).toISOString();
    return new ProjectStore(resolveLimits(options.limits), { appVersion: APP_VERSION, createdAt: now, modifiedAt: now }, undefined);
  }

  /** @internal Used by openProject with a snapshot it has checked. */
  static fromSnapshot(snap: ProjectSnapshot, limits: ProjectLimits, origin: OpenReport): ProjectStore {
    const store = new ProjectStore(limits, snap.info, origin);
    store.recordings.adopt(snap.recordings);
    store.models.adopt(snap.models);
    store.designs.adopt(snap.designs);
    store.trials.adopt(snap.trials);
    store.notes.adopt(snap.notes);
    return store;
  }

  /** App version that last saved it (this build's once saved), creation and modification times. */
  get info(): ProjectInfo {
    return { ...this.#info };
  }

  /**
   * Writes the whole project to `path` (must end in .ergostat) by the atomic protocol of
   * save.ts. Sets the modification time (options.now, default now) and this build's version.
   * Throws ProjectFileError; the previous file is then unchanged.
   */
  save(path: string, options: SaveOptions & { now?: Date } = {}): SaveReport {
    const info: ProjectInfo = {
      appVersion: APP_VERSION,
      createdAt: this.#info.createdAt,
      modifiedAt: (options.now ?? new Date()).toISOString(),
    };
    const report = saveSnapshot(path, {
      info,
      recordings: [...this.recordings.peekAll()],
      models: [...this.models.peekAll()],
      designs: [...this.designs.peekAll()],
      trials: [...this.trials.peekAll()],
      notes: [...this.notes.peekAll()],
    }, options);
    this.#info = info;
    return report;
  }
}
