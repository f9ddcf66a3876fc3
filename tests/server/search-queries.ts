/**
 * Labelled relevance set: each query with the procedure a technician means by it. Demo procedures
 * are named by seed key, planted corpus procedures by id (tests/support/search-corpus.ts).
 */
export const LABELLED_QUERIES: { q: string; expect: { seedKey: string } | { id: string } }[] = [
  // demo content, in the words people use at the bench
  { q: 'TC-18 first power up', expect: { seedKey: 'tc18-first-power-up' } },
  { q: 'tc18 HT supply', expect: { seedKey: 'tc18-first-power-up' } },
  { q: 'combo series lamp first power-up', expect: { seedKey: 'tc18-first-power-up' } },
  { q: 'TC-30H rail checks', expect: { seedKey: 'tc30h-rail-checks' } },
  { q: 'fixed bias silicon bridge', expect: { seedKey: 'tc30h-rail-checks' } },
  { q: 'TC30H plate supply ladder', expect: { seedKey: 'tc30h-rail-checks' } },
  { q: 'bleeder retrofit', expect: { seedKey: 'bleeder-retrofit' } },
  { q: 'stored charge discharge bleeder TC-30H', expect: { seedKey: 'bleeder-retrofit' } },
  { q: 'TC-5R recap', expect: { seedKey: 'tc5r-rectifier-recap' } },
  { q: 'table radio filter caps', expect: { seedKey: 'tc5r-rectifier-recap' } },
  { q: 'radio rectifier replacement', expect: { seedKey: 'tc5r-rectifier-recap' } },
  { q: 'silicon rectifier table radio', expect: { seedKey: 'tc5r-rectifier-recap' } },
  { q: 'bleder retrofit', expect: { seedKey: 'bleeder-retrofit' } },
  { q: 'TC-5R reservior', expect: { seedKey: 'tc5r-rectifier-recap' } },
  // planted procedures among the generated corpus: synonyms, units, typos
  { q: 'output xfmr squeal', expect: { id: 'planted-squeal' } },
  { q: 'MV-77 oscillation', expect: { id: 'planted-squeal' } },
  { q: 'squeal above 380V', expect: { id: 'planted-squeal' } },
  { q: 'series heater string receiver', expect: { id: 'planted-filament' } },
  { q: 'filament dropper KR-4', expect: { id: 'planted-filament' } },
  { q: '12.6V converter filament', expect: { id: 'planted-filament' } },
  { q: 'PB-900 slow blow', expect: { id: 'planted-slowblow' } },
  { q: 'bass head T fuse inrush', expect: { id: 'planted-slowblow' } },
  { q: 'time-delay fuse 470uF surge', expect: { id: 'planted-slowblow' } },
  { q: 'soft start thermistor', expect: { id: 'planted-slowblow' } },
  { q: 'transformer rewind acceptance', expect: { id: 'planted-xfmr' } },
  { q: 'xfmr rewind insulation test', expect: { id: 'planted-xfmr' } },
  { q: 'GT-12 6.3 V heater winding', expect: { id: 'planted-xfmr' } },
  { q: 'trasformer rewind', expect: { id: 'planted-xfmr' } },
  { q: 'can cap restuffing', expect: { id: 'planted-cap' } },
  { q: 'restuff 47 µF can capacitor', expect: { id: 'planted-cap' } },
  { q: 'DL-5 condenser reform', expect: { id: 'planted-cap' } },
  { q: 'public address recap', expect: { id: 'planted-cap' } },
];
