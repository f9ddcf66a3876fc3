import { z } from 'zod';
import type { UseFormReturn } from 'react-hook-form';
import { paperSheetInput } from '@shared/schemas/paper-sheets';
import { Field } from '@/components/ui/field';
import { labelOf } from '@/lib/form';

/** Today on this device, as a date input writes it. */
export const localToday = () => {
  const d = new Date();
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
};

/** The two fields of a paper sheet as a form holds them (an empty identifier is none). */
export const paperSheetFields = {
  paperDate: paperSheetInput.shape.date,
  paperRef: z.string(),
};
export const paperSheetOf = (v: { paperDate: string; paperRef: string }) => ({
  date: v.paperDate,
  ...(v.paperRef.trim() && { reference: v.paperRef.trim() }),
});
/** Where the server's field problems go on a form with these fields. */
export const PAPER_SHEET_RENAME = { 'paperSheet.date': 'paperDate', 'paperSheet.reference': 'paperRef' };

/** The date written on the paper (not after today) and the sheet identifier printed on it. */
export function PaperSheetFields({
  form,
}: {
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  form: UseFormReturn<any, any, any>;
}) {
  const errors = form.formState.errors as Record<string, { message?: string } | undefined>;
  return (
    <div className="grid grid-cols-1 gap-3 sm:grid-cols-2">
      <Field
        type="date"
        label={labelOf(paperSheetInput, 'date')}
        max={localToday()}
        className="value bg-paper"
        hint="As written on the sheet: the entries keep it as the day they were taken."
        error={errors.paperDate?.message}
        {...form.register('paperDate')}
      />
      <Field
        label={`${labelOf(paperSheetInput, 'reference')} (optional)`}
        placeholder="BS-…"
        autoComplete="off"
        className="value bg-paper"
        hint="Printed at the top of the sheet; it is checked against this revision and mains."
        error={errors.paperRef?.message}
        {...form.register('paperRef')}
      />
    </div>
  );
}
