/** Response shapes shared by server and client, one file per subject. Types only: no runtime code. */
export type * from './account';
export type * from './people';
export type * from './organization';
export type * from './cases';
export type * from './reports';
export type * from './programs';
export type * from './letters';
export type * from './uploads';
export type * from './notice-preferences';
export type * from './teams';
export type * from './stage-criteria';
export type * from './plan-templates';
export type * from './record-export';
export type * from './roster';
export type * from './exports';
