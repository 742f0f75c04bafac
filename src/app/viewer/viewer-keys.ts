/** What a key press asks the frame viewer to do. */
export type ViewerCommand = 'toggle-play' | 'previous' | 'next' | 'first' | 'last';

/** A description shown in the help tooltip and read to screen readers. */
export const VIEWER_KEYS_HELP = 'Keyboard: Space plays or pauses; ← and → step one frame; Home and End go to the first and last frame.';

/** Elements that already give these keys a meaning of their own. */
const OWNS_ARROWS = 'input, textarea, select, [contenteditable="true"], [role="slider"], [role="listbox"], [role="option"], [role="combobox"], [role="menu"], [role="menuitem"]';
const OWNS_SPACE = `${OWNS_ARROWS}, button, a[href], [role="button"], [role="checkbox"], [role="switch"]`;

/**
 * The command for a key press, or null when the key is not ours or the
 * focused control would use it itself (a slider's arrows, a button's space).
 */
export function viewerCommand(event: Pick<KeyboardEvent, 'key' | 'altKey' | 'ctrlKey' | 'metaKey'>, target: Element | null): ViewerCommand | null {
  if (event.altKey || event.ctrlKey || event.metaKey) return null;
  const command = COMMANDS[event.key];
  if (!command) return null;
  const owner = command === 'toggle-play' ? OWNS_SPACE : OWNS_ARROWS;
  return target?.closest(owner) ? null : command;
}

const COMMANDS: Readonly<Record<string, ViewerCommand>> = {
  ' ': 'toggle-play',
  ArrowLeft: 'previous',
  ArrowRight: 'next',
  Home: 'first',
  End: 'last',
};
