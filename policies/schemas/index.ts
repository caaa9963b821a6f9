export * from './common';
export * from './password';
export * from './auth';
export * from './people';
export * from './cases';
export * from './athlete';
export * from './programs';
export * from './letters';
