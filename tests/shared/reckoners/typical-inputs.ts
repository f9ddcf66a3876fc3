/**
 * One sound, typical input per reckoner, typed as an author would (values with units), taken from
 * the worked examples in docs/references.md and the demo shop's units. Tests that need "a valid
 * block of every kind" start from here; a registry test fails when a reckoner has no example.
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
      { label: 'B+2', targetVoltage: '300 V', current: '20 mA', capacitance: '47 µF', capacitorRating: '450 V', fittedResistance: '2k7' },
      { label: 'B+3', targetVoltage: '250 V', current: '5 mA', capacitance: '22 µF' },
    ],
    series: 'E12',
    rippleFrequency: '100 Hz',
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
  'reading-tolerance': { unit: 'V', measure: 'dc', expected: '350 V', tolerance: '±5 %', measured: '342 V' },
};
