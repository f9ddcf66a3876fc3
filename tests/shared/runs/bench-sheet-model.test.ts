import { describe, expect, it } from 'vitest';
import { benchSheetId, parseBenchSheetId } from '../../../shared/runs/bench-sheet-model';

const HASH = '3f2a9c1b7d04e5f60718293a4b5c6d7e8f9012345678901234567890abcdef12';
const params = (mainsVoltage: number, mainsFrequency: number) => ({
  mainsNominal: 230,
  mainsVoltage,
  mainsFrequency,
});

describe('bench sheet identifier', () => {
  it('names the revision hash, the mains and the day printed, and reads back as typed from the paper', () => {
    const id = benchSheetId(HASH, params(236, 50), '2026-03-14');
    expect(id).toBe('BS-3f2a9c1b7d04-236V-50Hz-20260314');
    // Copied by hand: lower case, spaces.
    expect(parseBenchSheetId(' bs-3F2A9C1B7D04-236v-50hz-2026 0314 ')).toEqual({
      hashPrefix: '3f2a9c1b7d04',
      mainsVoltage: 236,
      mainsFrequency: 50,
      printedOn: '2026-03-14',
    });
  });

  it('keeps a mains with decimals to two places, and refuses what is not an identifier', () => {
    const id = benchSheetId(HASH, params(117.456, 59.9), '2026-01-02');
    expect(id).toBe('BS-3f2a9c1b7d04-117.46V-59.9Hz-20260102');
    expect(parseBenchSheetId(id)).toMatchObject({ mainsVoltage: 117.46, mainsFrequency: 59.9 });
    for (const bad of [
      '',
      'sheet 4',
      'BS-3f2a9c1b7d0-236V-50Hz-20260314',
      'BS-3f2a9c1b7d04-236V-50Hz-2026031',
    ])
      expect(parseBenchSheetId(bad), bad).toBeNull();
  });
});
