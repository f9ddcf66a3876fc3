import { describe, expect, it } from 'vitest';
import { SearchIndex, type IndexedProcedure } from '../../../server/search/search-index';
import { stem, tokenize } from '../../../server/search/vocabulary';

const doc = (id: string, title: string, body: string, model = ''): IndexedProcedure => ({
  id,
  revisionId: `${id}-r`,
  revisionNumber: 1,
  title,
  family: 'Guitar amplifier',
  model,
  tags: [],
  body,
  readings: '',
  reckoners: '',
});

const LIBRARY = [
  doc('tc18', 'TC-18 combo first power-up', 'Bring the HT up on a series lamp; check the fuse.', 'TC-18'),
  doc('tc180', 'TC-180 head fuse check', 'Fit the fuse and check the heater winding.', 'TC-180'),
  doc('tc30h', 'TC-30H rail checks', 'Loaded B+ at each node; hum at the choke.', 'TC-30H'),
  doc('rect', 'Rectifier swap', 'Replace the 5AR4 with two 1N4007 diodes; the EL34 pair stays.'),
  doc('hum', 'Hum hunt', 'Hum at the output with the volume down; one hand in the pocket.'),
  doc('bleed', 'Bleeder check', 'Measure the 2k2 bleeder; the heater string runs at 6.3 V.'),
  doc('radio', 'Table radio recap', 'The table radio needs new filter capacitors.'),
];
const index = new SearchIndex();
index.replaceAll(LIBRARY);
const ids = (q: string) => index.search(q).results.map((r) => r.procedureId);

describe('model and part codes have one normal form', () => {
  it('TC-18, TC18, tc 18, tc.18 and Tc–18 are one term and find the same procedures', () => {
    for (const typed of ['TC-18', 'TC18', 'tc.18', 'Tc\u201318'])
      expect(tokenize(typed)[0], typed).toBe('tc18');
    const want = ids('TC-18');
    expect(want).toEqual(['tc18']);
    for (const q of ['TC18', 'tc 18', 'tc.18', 'Tc\u201318', 'tc-18']) expect(ids(q), q).toEqual(want);
    // A longer code is another code: TC-18 does not find TC-180.
    expect(ids('TC18 fuse')).toEqual(['tc18']);
  });

  it('valve and semiconductor type codes match however spaced or dashed', () => {
    for (const q of [
      '5AR4',
      '5ar4',
      '5-AR-4',
      '5 AR 4',
      '1N4007',
      '1n 4007',
      '1N-4007',
      'EL34',
      'el 34',
      'El-34',
    ])
      expect(ids(q), q).toEqual(['rect']);
    expect(ids('6AR4')).toEqual([]);
  });

  it('a model letter is not read as a unit: TC-30H is a model, not 30 henries', () => {
    expect(tokenize('TC-30H')).toContain('tc30h');
    expect(ids('tc 30 h hum')).toEqual(['tc30h']);
  });

  it('reads resistor and capacitor values written in the RKM code of IEC 60062', () => {
    // IEC 60062 RKM code (docs/references.md §4): the letter is the decimal point and the multiplier, 4R7 = 4.7 Ω.
    expect(tokenize('2k2')).toEqual(tokenize('2.2 kΩ'));
    expect(tokenize('4R7')).toEqual(tokenize('4.7 Ω'));
    expect(tokenize('4n7')).toEqual(tokenize('4.7 nF'));
    expect(ids('2.2k bleeder')).toEqual(['bleed']);
  });
});

describe('words of a plain question', () => {
  it('drops the filler of a question and finds what the words ask', () => {
    expect(tokenize('how does my fuse blow')).toEqual(['fuse', 'blow']);
    expect(ids('how do I check the fuse on my TC-18')).toEqual(ids('check fuse TC-18'));
    expect(ids('check fuse TC-18')).toEqual(['tc18']);
  });

  it('meets plural and inflected forms of a word', () => {
    const pairs: [string, string][] = [
      ['fuses', 'fuse'],
      ['fused', 'fuse'],
      ['capacitors', 'capacitor'],
      ['restuffing', 'restuff'],
      ['discharged', 'discharge'],
      ['windings', 'winding'],
      ['supplies', 'supply'],
    ];
    for (const [a, b] of pairs) expect(stem(a), `${a} ~ ${b}`).toBe(stem(b));
    expect(stem('string')).not.toBe(stem('strong'));
  });
});

describe('every word first, and quiet when nothing matches them all', () => {
  it('lists only procedures matching every word; none are padded in from partial matches', () => {
    const page = index.search('hum choke');
    expect(page.results.map((r) => r.procedureId)).toEqual(['tc30h']);
    expect(page.partial).toBeNull();
  });

  it('offers partial matches as a separate, labelled group, each with the words it lacks', () => {
    const page = index.search('hum speaker cone');
    expect(page.total).toBe(0);
    expect(page.results).toEqual([]);
    expect(page.partial?.label).toBe('Matches some of your words');
    expect(page.partial!.results.map((r) => r.procedureId).sort()).toEqual(['hum', 'tc30h']);
    expect(page.partial!.results[0]!.missing).toEqual(['speaker', 'cone']);
  });

  it('allows no typo on a word of four letters or fewer, except two letters swapped', () => {
    expect(index.search('cone').results).toEqual([]); // not "one"
    expect(index.search('cone').partial).toBeNull();
    expect(ids('hmu choke')).toEqual(['tc30h']); // a swap
    expect(ids('hux')).toEqual([]); // one letter changed in three
  });

  it('scales the typo budget with the length of the word, keeping its first letter', () => {
    expect(ids('hetaer winding')).toEqual(['tc180']); // a swap in six letters
    expect(ids('heatr winding')).toEqual(['tc180']); // one letter missing from six
    expect(ids('cable recap')).toEqual([]); // "table" differs in the first letter
    expect(ids('rectifeir')).toEqual(['rect']); // a swap in nine letters
  });

  it('needs one word matched as written; a query of typos only says which words it searched instead', () => {
    const page = index.search('hetaer');
    expect(page.correctedQuery).toBe('heater');
    expect(page.results.map((r) => r.procedureId).sort()).toEqual(['bleed', 'tc180']);
    expect(index.search('qqqzzzx').total).toBe(0);
  });
});

describe('order-independent ranking', () => {
  it('scores a procedure the same whatever was indexed before it', () => {
    const again = new SearchIndex();
    for (const p of [...LIBRARY].reverse()) again.upsert(p);
    for (const q of ['fuse', 'heater', 'hum', 'TC-18', 'check'])
      expect(again.search(q).results, q).toEqual(index.search(q).results);
  });
});
