export * from './people';
export * from './sessions';
export * from './audit';
export * from './procedures';
export * from './mail';
export * from './runs';
export * from './review';
export * from './auth';
