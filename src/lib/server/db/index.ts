/*
 * What the app's services import. Importing binds the models to the process-wide
 * connection; Sequelize connects lazily, so this needs no database until a query runs.
 */
import { db } from './connection';

export const sequelize = db();
export { closeDb } from './connection';
export * from './models';
