export * from './people';
export * from './sessions';
export * from './audit';
export * from './procedures';
export * from './mail';
