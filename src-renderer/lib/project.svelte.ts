// The renderer's view of the open project: a reactive summary refreshed after each operation.
import { call } from './client.ts';
import type { ProjectSummary } from '../../src-main/api/results.ts';

export const project = $state<{ summary: ProjectSummary | null }>({ summary: null });

export async function refreshProject(): Promise<void> {
  project.summary = await call('project.state', {});
  window.__ergostatDirty = project.summary.dirty;
}

export function setProject(summary: ProjectSummary): void {
  project.summary = summary;
  window.__ergostatDirty = summary.dirty;
}
