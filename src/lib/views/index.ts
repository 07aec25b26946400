/*
 * The plain shapes services return and pages, components and the JSON API show, one file
 * per area. Types only: components import them with `import type`, so client code never
 * depends on a server module. Model instances never leave services.
 */
export type * from './build';
export type * from './guide';
export type * from './reports';
export type * from './review';
export type * from './guide-editor';
export type * from './catalog';
export type * from './sightings';
export type * from './regions';
export type * from './parts';
export type * from './admin';
export type * from './photos';
