import type { MigrationFn } from 'umzug';
import type { QueryInterface } from 'sequelize';
import * as accounts from './0001-accounts';

export type Migration = { name: string; up: MigrationFn<QueryInterface>; down: MigrationFn<QueryInterface> };

// Listed by hand, in order, so tsx, jest and compiled code all find the same set.
export const migrations: Migration[] = [{ name: '0001-accounts', ...accounts }];
