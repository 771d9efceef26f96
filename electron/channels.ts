// IPC channel names shared by main and preload (the operation names come from the table).
export const CALL = 'ergostat:call';
export const CANCEL = 'ergostat:cancel';
export const PROGRESS = 'ergostat:progress';
export const MENU = 'ergostat:menu';

/** Commands the menu sends to the renderer (the renderer decides what they mean on its screen). */
export type MenuCommand = 'new' | 'open' | 'save' | 'save-as' | 'export' | 'open-recent';
