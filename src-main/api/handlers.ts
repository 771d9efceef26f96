// The handlers behind the operation table, over one in-memory Workspace. Used by Electron's
// main process, the browser bridge and the tests alike. Operations whose engine has not landed
// are simply absent (the gate answers "not available in this build").
import type { Handlers } from './gate.ts';
import type { Operations } from './table.ts';
import { SAFETY_CAUTIONS } from '../safety.ts';
import { APP_VERSION } from '../version.ts';

export function createHandlers(): Partial<Handlers<Operations>> {
  return {
    'app.info': () => ({ name: 'Ergostat', version: APP_VERSION, projectSchema: 0, cautions: [...SAFETY_CAUTIONS] }),
  };
}
