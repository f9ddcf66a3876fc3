/** Small procedure-document pieces shared by the API tests. */

export const params = { mainsNominal: 230, mainsVoltage: 230, mainsFrequency: 50 };

export const fuseBlock = (htAmps: string) => ({
  type: 'reckoner',
  attrs: {
    id: 'fuse-block-1',
    name: 'fuse',
    kind: 'mains-fuse',
    inputs: {
      windings: [
        { label: 'HT', volts: '300 V', amps: htAmps },
        { label: 'Heaters', volts: '6.3 V', amps: '2.5 A' },
      ],
      mainsVoltage: { param: 'mainsVoltage' },
    },
  },
});
