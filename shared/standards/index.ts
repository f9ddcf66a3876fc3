export * from './eSeries';
export * from './fuses';
export * from './thresholds';
