export * from './actor';
export * from './subjects';
export * from './ability';
