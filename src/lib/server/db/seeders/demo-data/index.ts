/* One import point for the seeder and the tests; relative paths keep it usable outside Vite. */
export * from './types';
export * from './users';
export * from './regions';
export * from './stores';
export * from './parts';
export * from './quotes';
export * from './guides';
export * from './upkeep';
