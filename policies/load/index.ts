export * from './patterns';
export * from './units';
export * from './in-force';
export * from './describe';
export * from './plan-diff';
export * from './workload';
export * from './pain-rule';
export * from './one-rm';
