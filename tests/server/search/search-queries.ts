/**
 * Labelled relevance set: each query with the procedure a technician means by it. Demo procedures
 * are named by seed key, planted corpus procedures by id (tests/support/search-corpus.ts). Codes
 * are typed every way a person types them (TC-18, TC18, tc 18, tc.18).
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
  { q: 'silicon rectifier table radio', expect: { seedKey: 'tc5r-silicon-conversion' } },
  { q: 'bleder retrofit', expect: { seedKey: 'bleeder-retrofit' } },
  { q: 'TC-5R reservior', expect: { seedKey: 'tc5r-rectifier-recap' } },
  { q: 'choke input supply', expect: { seedKey: 'tc35m-choke-input-checks' } },
  { q: 'critical inductance bleeder', expect: { seedKey: 'tc35m-choke-input-checks' } },
  { q: 'restoring resistor silicon diodes', expect: { seedKey: 'tc5r-silicon-conversion' } },
  { q: 'convert 120 V to 230 V', expect: { seedKey: 'tc30h-mains-conversion' } },
  { q: 'TC-30H 50 Hz flux', expect: { seedKey: 'tc30h-mains-conversion' } },
  { q: 'tc35m part ratings high mains', expect: { seedKey: 'tc35m-choke-input-checks' } },
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
  // model codes however typed
  { q: 'TC18 first power up', expect: { seedKey: 'tc18-first-power-up' } },
  { q: 'tc 18 series lamp', expect: { seedKey: 'tc18-first-power-up' } },
  { q: 'tc.18 heater budget', expect: { seedKey: 'tc18-first-power-up' } },
  { q: 'Tc-18 fuse', expect: { seedKey: 'tc18-first-power-up' } },
  { q: 'TC 30H rail checks', expect: { seedKey: 'tc30h-rail-checks' } },
  { q: 'tc30h fixed bias', expect: { seedKey: 'tc30h-rail-checks' } },
  { q: 'TC30H bleeder', expect: { seedKey: 'bleeder-retrofit' } },
  { q: 'TC5R filter caps', expect: { seedKey: 'tc5r-rectifier-recap' } },
  { q: 'tc 5r rectifier', expect: { seedKey: 'tc5r-rectifier-recap' } },
  { q: 'mv77 squeal', expect: { id: 'planted-squeal' } },
  { q: 'KR 4 dropper', expect: { id: 'planted-filament' } },
  { q: 'pb900', expect: { id: 'planted-slowblow' } },
  { q: 'gt.12 rewind', expect: { id: 'planted-xfmr' } },
  { q: 'DL5 restuff', expect: { id: 'planted-cap' } },
  // valve and part type codes
  { q: '5AR4 to silicon', expect: { id: 'planted-rectvalve' } },
  { q: '5 AR 4 rectifier', expect: { id: 'planted-rectvalve' } },
  { q: '1n-4007 diodes', expect: { id: 'planted-rectvalve' } },
  { q: 'GZ34', expect: { id: 'planted-rectvalve' } },
  { q: 'el 34 bias', expect: { id: 'planted-outputpair' } },
  { q: 'EL-34 matched pair', expect: { id: 'planted-outputpair' } },
  { q: 'ecc83 heater', expect: { id: 'planted-outputpair' } },
  // plain questions: their filler words are dropped
  { q: 'how do I bring up my TC-18', expect: { seedKey: 'tc18-first-power-up' } },
  { q: 'what does the bleeder do on the TC-30H', expect: { seedKey: 'bleeder-retrofit' } },
  { q: 'which fuse does the PB-900 need', expect: { id: 'planted-slowblow' } },
  // typos of one letter or a swap
  { q: 'hetaer winding GT-12', expect: { id: 'planted-xfmr' } },
  { q: 'rectifeir valve silicon', expect: { id: 'planted-rectvalve' } },
];

/**
 * Negatives: things the library does not cover. None may return a full match ("matches some of
 * your words" is allowed; it is a separate, labelled group).
 */
export const NEGATIVE_QUERIES: string[] = [
  'speaker cone repair',
  'guitar pickup rewind',
  'phantom power 48V',
  'microphone preamp noise',
  'reverb tank replacement',
  'tremolo circuit',
  'turntable belt',
  'how do I fix my cone',
  'TC-19 fuse',
  'EL84 bias',
  'tc 40 rail checks',
  'bluetooth pairing',
  'valve amp speaker cone',
  'cable repair',
];
