import type { SaveState } from './use-draft-save';

const time = (iso: string) => new Date(iso).toLocaleTimeString([], { hour: '2-digit', minute: '2-digit' });

const TEXT: { [K in SaveState['kind']]: (s: Extract<SaveState, { kind: K }>) => string } = {
  saved: (s) => `Saved ${time(s.at)}`,
  unsaved: () => 'Unsaved changes',
  saving: () => 'Saving…',
  offline: () => 'Offline — kept on this device',
  refused: () => 'Not saved — the server refused it (see below); kept on this device',
  conflict: () => 'Not saved — someone else saved first; kept on this device',
  failed: (s) => `Not saved — ${s.message}; kept on this device`,
};

/** The one line that says where the author's work is. */
export function SaveStatus({ state }: { state: SaveState }) {
  const text = (TEXT[state.kind] as (s: SaveState) => string)(state);
  const tone =
    state.kind === 'saved'
      ? 'text-ok'
      : state.kind === 'saving' || state.kind === 'unsaved'
        ? 'text-graphite-soft'
        : 'text-out font-semibold';
  return (
    <p role="status" aria-live="polite" data-save-state={state.kind} className={`text-sm ${tone}`}>
      {text}
    </p>
  );
}
