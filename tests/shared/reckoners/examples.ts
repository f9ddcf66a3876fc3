/**
 * One valid worked example per reckoner kind, with values from docs/references.md, and one output
 * each that the example fixes by hand. Every registered reckoner must have an entry here.
 */
export interface WorkedExample {
  inputs: Record<string, unknown>;
  /** An output key and its value worked by hand, with the source. */
  check: { key: string; value: number; source: string };
}

export const WORKED_EXAMPLES: Record<string, WorkedExample> = {
  'mains-fuse': {
    inputs: {
      windings: [
        { label: 'HT', volts: '250 V', amps: '100 mA' },
        { label: 'heaters', volts: '6.3 V', amps: '3 A' },
        { label: 'rectifier heater', volts: '5 V', amps: '2 A' },
      ],
      mainsVoltage: '120 V',
      efficiency: '85 %',
    },
    check: {
      key: 'primaryCurrent',
      value: 0.5284,
      source: '53.9 VA ÷ (0.85 × 120 V), docs/references.md §1',
    },
  },
  'peak-no-load': {
    inputs: { windingVoltage: '120 V', mainsNominal: '120 V', rectifier: 'silicon-bridge', diodeDrop: '1 V' },
    check: { key: 'peakVoltage', value: 169.71, source: '√2 × 120 V, docs/references.md §2' },
  },
  'loaded-bplus': {
    inputs: {
      windingVoltage: '300 V',
      sourceResistance: '50 Ω',
      reservoir: '47 µF',
      mainsFrequency: '50 Hz',
      loadCurrent: '100 mA',
    },
    check: {
      key: 'noLoadDc',
      value: Math.SQRT2 * 300 - 1.8,
      source: '√2 × 300 V less two 0.9 V diode drops, docs/references.md §2',
    },
  },
  'dropper-ladder': {
    inputs: {
      startVoltage: '350 V',
      stages: [{ label: 'B+2', targetVoltage: '300 V', current: '20 mA', capacitance: '47 µF' }],
    },
    check: { key: 'stage1.resistanceExact', value: 2500, source: '50 V ÷ 20 mA, docs/references.md §4' },
  },
  bleeder: {
    inputs: { capacitance: '100 µF', chargedVoltage: '450 V', bleederResistance: '22k' },
    check: { key: 'storedEnergy', value: 10.125, source: '½ × 100 µF × (450 V)², docs/references.md §5' },
  },
  'choke-input': {
    inputs: {
      windingVoltage: '350 V',
      rectifier: 'silicon-centre-tap',
      diodeDrop: '1 V',
      chokeInductance: '10 H',
      chokeResistance: '100 Ω',
      loadCurrent: '100 mA',
    },
    check: {
      key: 'dcOutput',
      value: (2 * Math.SQRT2 * 350) / Math.PI - 1 - 10,
      source: '0.9003 × 350 V less 1 V and 100 mA × 100 Ω, docs/references.md §3',
    },
  },
  'heater-budget': {
    inputs: {
      windingVoltage: '6.3 V',
      windingCurrent: '3 A',
      heaters: [
        { label: 'small-signal', volts: '6.3 V', amps: '300 mA', count: 4 },
        { label: 'output', volts: '6.3 V', amps: '900 mA' },
      ],
    },
    check: { key: 'totalCurrent', value: 2.1, source: '4 × 0.3 A + 0.9 A, docs/references.md §6' },
  },
  'mains-conversion': {
    inputs: {
      fromVoltage: '120 V',
      fromFrequency: '60 Hz',
      toVoltage: '230 V',
      toFrequency: '50 Hz',
      connections: [{ volts: '120 V' }, { volts: '240 V' }],
      fuseRating: '1 A',
    },
    check: { key: 'fuseExact', value: 120 / 230, source: '1 A × 120 V ÷ 230 V, docs/references.md §1' },
  },
  'switch-on-surge': {
    inputs: {
      windingVoltage: '300 V',
      mainsVoltage: '230 V',
      secondaryResistance: '50 Ω',
      primaryResistance: '23 Ω',
      reservoir: '100 µF',
    },
    check: {
      key: 'sourceResistance',
      value: 50 + 23 * (300 / 230) ** 2,
      source: 'R_s + R_p (N_s/N_p)², docs/references.md §10',
    },
  },
  'transformer-loading': {
    inputs: {
      mainsVoltage: '230 V',
      windings: [
        { volts: '300 V', amps: '120 mA' },
        { volts: '6.3 V', amps: '3 A' },
      ],
    },
    check: {
      key: 'totalVA',
      value: 36 + 18.9,
      source: '300 V × 0.12 A + 6.3 V × 3 A, docs/references.md §1',
    },
  },
  'rectifier-substitution': {
    inputs: { windingVoltage: '350 V', fromValveDrop: '45 V', diodeDrop: '1 V', loadCurrent: '150 mA' },
    check: {
      key: 'bplusChange',
      value: 44,
      source: '45 V valve drop less one 1 V diode, docs/references.md §2',
    },
  },
  'part-ratings': {
    inputs: {
      windingVoltage: '300 V',
      highMains: '10 %',
      unloadedRise: '10 %',
      diodeDrop: '1 V',
      sourceResistance: '80 Ω',
      loadCurrent: '100 mA',
      reservoir: '47 µF',
    },
    check: {
      key: 'noLoadPeakHigh',
      value: Math.SQRT2 * 300 * 1.1 * 1.1 - 2,
      source: '√2 × 300 V × 1.1 × 1.1 less two 1 V drops, docs/references.md §2',
    },
  },
  'reading-tolerance': {
    inputs: { unit: 'V', expected: '230 V', tolerance: '±10 %', measured: '240 V' },
    check: { key: 'low', value: 207, source: 'IEC 60038:2009 230 V − 10 %, docs/references.md §2' },
  },
};

/**
 * One sound, typical input per reckoner, typed as an author would (every field, values with units),
 * from the demo shop's units: the starting point for tests that change one field at a time (unit
 * slips, measures, unknown names). A registry test fails when a reckoner has no entry here.
 */
export const TYPICAL_INPUTS: Record<string, Record<string, unknown>> = {
  'mains-fuse': {
    load: 'windings',
    windings: [
      { label: 'HT', volts: '250 V', amps: '100 mA' },
      { label: 'Heaters', volts: '6.3 V', amps: '3 A' },
      { label: 'Rectifier heater', volts: '5 V', amps: '2 A' },
    ],
    mainsVoltage: '230 V',
    efficiency: '85 %',
    margin: '1.25',
    fuseType: 'T',
    inrushDuration: '200 ms',
  },
  'peak-no-load': {
    windingVoltage: '280 V',
    windingBasis: 'nominal',
    mainsNominal: '230 V',
    mainsActual: '236 V',
    rectifier: 'silicon-bridge',
    diodeDrop: '0.9 V',
    unloadedRise: '8 %',
  },
  'loaded-bplus': {
    windingVoltage: '300 V',
    sourceResistance: '80 Ω',
    reservoir: '47 µF',
    reservoirRating: '450 V',
    mainsFrequency: '50 Hz',
    loadCurrent: '80 mA',
    rectifier: 'silicon-bridge',
    diodeDrop: '0.9 V',
  },
  'dropper-ladder': {
    startVoltage: '350 V',
    stages: [
      {
        label: 'B+2',
        targetVoltage: '300 V',
        current: '20 mA',
        capacitance: '47 µF',
        capacitorRating: '450 V',
        fittedResistance: '2k7',
      },
      { label: 'B+3', targetVoltage: '250 V', current: '5 mA', capacitance: '22 µF' },
    ],
    series: 'E12',
    mainsFrequency: '50 Hz',
  },
  'choke-input': {
    windingVoltage: '375 V',
    rectifier: 'valve',
    valveDrop: '50 V',
    windingResistance: '120 Ω',
    chokeInductance: '8 H',
    chokeResistance: '90 Ω',
    loadCurrent: '150 mA',
    lightestLoad: '20 mA',
    mainsFrequency: '50 Hz',
    filterCapacitance: '50 µF',
  },
  bleeder: {
    capacitance: '100 µF',
    chargedVoltage: '450 V',
    bleederResistance: '220k',
    threshold: '60 V',
    targetTime: '60 s',
  },
  'heater-budget': {
    windingVoltage: '6.3 V',
    windingCurrent: '3 A',
    arrangement: 'parallel',
    heaters: [
      { label: 'Output pentode', volts: '6.3 V', amps: '760 mA', count: 2 },
      { label: 'Double triode', volts: '6.3 V', amps: '300 mA', count: 2 },
    ],
  },
  'mains-conversion': {
    fromVoltage: '117 V',
    fromFrequency: '60 Hz',
    toVoltage: '230 V',
    toFrequency: '50 Hz',
    connections: [
      { label: 'Halves in parallel', volts: '117 V' },
      { label: 'Halves in series', volts: '234 V' },
    ],
    fuseRating: '1.25 A',
    series: 'iec',
    secondaryVoltage: '325 V',
  },
  'switch-on-surge': {
    windingVoltage: '280 V',
    mainsVoltage: '230 V',
    rectifier: 'silicon-bridge',
    diodeDrop: '0.9 V',
    secondaryResistance: '65 Ω',
    primaryResistance: '18 Ω',
    reservoir: '47 µF',
    fuseI2t: '12 A²s',
    diodeSurge: '30 A',
    mainsFrequency: '50 Hz',
    runningCurrent: '350 mA',
  },
  'transformer-loading': {
    mainsVoltage: '230 V',
    primaryResistance: '14 Ω',
    efficiency: '88 %',
    ratedVA: '80 VA',
    windings: [
      { label: 'HT', volts: '280 V', amps: '150 mA', ratedAmps: '200 mA', resistance: '85 Ω' },
      { label: 'Heaters', volts: '6.3 V', amps: '3.5 A', ratedAmps: '4 A' },
    ],
  },
  'rectifier-substitution': {
    windingVoltage: '340 V',
    circuit: 'centre-tap',
    from: 'valve',
    to: 'silicon',
    fromValveDrop: '50 V',
    diodeDrop: '0.9 V',
    loadCurrent: '140 mA',
    nodes: [
      { label: 'B+1', volts: '410 V' },
      { label: 'B+2', volts: '360 V' },
    ],
    highMains: '10 %',
    diodePiv: '1000 V',
    outputWarmUp: '25 s',
    rectifierWarmUp: '8 s',
  },
  'part-ratings': {
    windingVoltage: '280 V',
    highMains: '10 %',
    unloadedRise: '8 %',
    rectifier: 'silicon-bridge',
    diodeDrop: '0.9 V',
    sourceResistance: '90 Ω',
    mainsFrequency: '50 Hz',
    loadCurrent: '120 mA',
    reservoir: '47 µF',
    reservoirRippleRating: '1.5 A',
    capacitors: [
      { label: 'Reservoir', rating: '500 V' },
      { label: 'B+2', rating: '450 V' },
    ],
    resistors: [
      { label: 'R1', resistance: '4k7', current: '20 mA', powerRating: '5 W', voltageLimit: '750 V' },
    ],
    resistorDerating: '50 %',
    diodePiv: '1000 V',
    diodeSurge: '30 A',
  },
  'reading-tolerance': { unit: 'V', measure: 'dc', expected: '350 V', tolerance: '±5 %', measured: '342 V' },
};
