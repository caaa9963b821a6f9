export * from './patterns';
export * from './units';
export * from './in-force';
export * from './describe';
