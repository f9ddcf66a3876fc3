/** The within / out-of-tolerance mark, in words as well as colour. */
export function Mark({ within, pending = false }: { within: boolean | null | undefined; pending?: boolean }) {
  if (within === undefined) return null;
  const label = within === null ? 'no band' : within ? 'within' : 'OUT of tolerance';
  const tone =
    within === null
      ? 'border-rule text-graphite-soft'
      : within
        ? 'border-ok text-ok'
        : 'border-out bg-out-wash text-out';
  return (
    <span
      data-mark={within === null ? 'none' : within ? 'within' : 'out'}
      className={`inline-flex items-center gap-1 rounded border px-2 py-0.5 text-sm font-semibold ${tone}`}
    >
      {within === false ? '▲' : within ? '●' : '○'} {label}
      {pending && <span className="font-normal">(on this tablet)</span>}
    </span>
  );
}
