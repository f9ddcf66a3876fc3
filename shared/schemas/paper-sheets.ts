import { z } from 'zod';
import { paramsSchema } from '../document/params';
import { oneLine } from './text';

/**
 * Readings copied from a blank bench sheet: the date written on the paper and, when given, the sheet
 * identifier printed on it. The server checks the date against today and the revision's approval.
 */
export const paperSheetInput = z
  .object({
    date: z.iso
      .date({ error: 'Enter the date written on the paper sheet, such as 2026-03-14' })
      .meta({ title: 'Paper sheet date' }),
    reference: oneLine(80, { label: 'Sheet identifier' }).optional(),
  })
  .strict()
  .meta({ title: 'Paper sheet' });
export type PaperSheetInput = z.infer<typeof paperSheetInput>;

/** Say (or stop saying) that the next entries of a run are copied from a paper sheet. */
export const paperSheetBody = z.object({ paperSheet: paperSheetInput.nullable() }).strict();

const mains = (key: 'mainsVoltage' | 'mainsFrequency') =>
  z.coerce.number<string>().pipe(paramsSchema.shape[key] as z.ZodType<number, number>);

/** The mains a blank bench sheet is worked out for, from the address (volts rms, hertz). */
export const benchSheetQuery = z
  .object({
    mainsVoltage: mains('mainsVoltage'),
    mainsFrequency: mains('mainsFrequency').optional(),
  })
  .strict();
