// Everything a project holds, as one plain value: what save writes and open reads.
import type { DocumentEntry, NoteEntry, ProjectInfo, RecordingEntry, TrialEntry } from './types.ts';

export interface ProjectSnapshot {
  info: ProjectInfo;
  recordings: RecordingEntry[];
  models: DocumentEntry[];
  designs: DocumentEntry[];
  trials: TrialEntry[];
  notes: NoteEntry[];
}
