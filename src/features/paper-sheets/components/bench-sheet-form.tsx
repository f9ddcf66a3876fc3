import { z } from 'zod';
import type { ProcedureParams } from '@shared/document/params';
import { benchSheetQuery } from '@shared/schemas/paper-sheets';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { useZodForm } from '@/lib/form';

const form = z.object({
  mainsVoltage: z.string().trim().pipe(benchSheetQuery.shape.mainsVoltage),
  mainsFrequency: z.string().trim().pipe(benchSheetQuery.shape.mainsFrequency.unwrap()),
});

/**
 * "Print a blank bench sheet": the revision's steps on paper, every expected value and band worked
 * out for the mains chosen here (the procedure's own by default), for a bench without the tablet.
 */
export function BenchSheetForm({ revisionId, params }: { revisionId: string; params: ProcedureParams }) {
  const f = useZodForm(form, {
    defaultValues: {
      mainsVoltage: String(params.mainsNominal),
      mainsFrequency: String(params.mainsFrequency),
    },
  });
  const { errors } = f.formState;
  const print = f.handleSubmit(({ mainsVoltage, mainsFrequency }) => {
    const query = new URLSearchParams({
      mainsVoltage: String(mainsVoltage),
      mainsFrequency: String(mainsFrequency),
    });
    // The answer is a download (Content-Disposition: attachment): the page stays where it is.
    window.location.assign(`/api/revisions/${revisionId}/bench-sheet.pdf?${query}`);
  });
  return (
    <details className="rounded-lg border border-rule bg-card p-3" data-bench-sheet>
      <summary className="min-h-11 cursor-pointer content-center font-semibold">
        Print a blank bench sheet
      </summary>
      <form onSubmit={print} noValidate className="mt-2 flex flex-col gap-3">
        <p className="text-sm text-graphite-soft">
          For a bench without the tablet: every step with a box to tick, every reading with its expected value
          and band worked out for this mains. Copy the readings into a bench run later with the date written
          on the sheet.
        </p>
        <div className="grid grid-cols-1 gap-3 sm:grid-cols-2">
          <Field
            label="Mains for the sheet (V rms)"
            inputMode="decimal"
            autoComplete="off"
            className="value bg-paper"
            error={errors.mainsVoltage?.message}
            {...f.register('mainsVoltage')}
          />
          <Field
            label="Mains frequency (Hz)"
            inputMode="decimal"
            autoComplete="off"
            className="value bg-paper"
            error={errors.mainsFrequency?.message}
            {...f.register('mainsFrequency')}
          />
        </div>
        <Button type="submit" className="self-start">
          Print the bench sheet (PDF)
        </Button>
      </form>
    </details>
  );
}
