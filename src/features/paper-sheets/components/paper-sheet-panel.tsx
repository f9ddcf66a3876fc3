import { z } from 'zod';
import type { RunView } from '@shared/schemas/runs';
import { Button } from '@/components/ui/button';
import { FormProblem } from '@/components/ui/form-problem';
import { showServerError, useZodForm } from '@/lib/form';
import { useSetPaperSheet } from '../api/paper-sheet';
import {
  localToday,
  PAPER_SHEET_RENAME,
  PaperSheetFields,
  paperSheetFields,
  paperSheetOf,
} from './paper-sheet-fields';

const form = z.object(paperSheetFields);

/**
 * On an open run, for its performer: say the readings that follow are copied from a paper bench
 * sheet (they keep its date), or go back to entering at the bench.
 */
export function PaperSheetPanel({ run }: { run: RunView }) {
  const set = useSetPaperSheet(run.id);
  const f = useZodForm(form, { defaultValues: { paperDate: localToday(), paperRef: '' } });
  const save = f.handleSubmit((v) =>
    set.mutate(paperSheetOf(v), { onError: (e) => showServerError(f, e, PAPER_SHEET_RENAME) }),
  );
  if (run.paperSheet)
    return (
      <section
        data-paper-sheet
        className="flex flex-wrap items-center gap-3 rounded-lg border border-rule bg-card p-3"
      >
        <p className="text-sm">
          Entries are being copied from a paper sheet dated{' '}
          <span className="value font-semibold">{run.paperSheet.date}</span>
          {run.paperSheet.reference && (
            <>
              {' '}
              (sheet <span className="value">{run.paperSheet.reference}</span>)
            </>
          )}
          : each keeps that date as the day it was taken.
        </p>
        <Button variant="quiet" disabled={set.isPending} onClick={() => set.mutate(null)}>
          Back to entering at the bench
        </Button>
      </section>
    );
  return (
    <details data-paper-sheet className="rounded-lg border border-rule bg-card p-3">
      <summary className="min-h-11 cursor-pointer content-center font-semibold">
        Copying readings from a paper bench sheet?
      </summary>
      <form onSubmit={save} noValidate className="mt-2 flex flex-col gap-3">
        <FormProblem formState={f.formState} />
        <PaperSheetFields form={f} />
        <Button type="submit" className="self-start" disabled={set.isPending}>
          Copy from this paper sheet
        </Button>
      </form>
    </details>
  );
}
