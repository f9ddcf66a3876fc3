import { MARK_WORDS } from '@shared/runs/run-sheet-model';

/** The in-band / out-of-band mark, in words as well as colour. */
export function Mark({ within, pending = false }: { within: boolean | null | undefined; pending?: boolean }) {
  if (within === undefined) return null;
  const kind = within === null ? 'none' : within ? 'within' : 'out';
  const tone =
    within === null
      ? 'border-rule text-graphite-soft'
      : within
        ? 'border-ok text-ok'
        : 'border-out bg-out-wash text-out';
  return (
    <span
      data-mark={kind}
      className={`inline-flex items-center gap-1 whitespace-nowrap rounded border px-2 py-0.5 text-sm font-semibold ${tone}`}
    >
      {within === false ? '▲' : within ? '●' : '○'} {MARK_WORDS[kind]}
      {pending && <span className="font-normal">(on this tablet)</span>}
    </span>
  );
}
