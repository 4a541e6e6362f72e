/**
 * Every schema migration, in order. Listed explicitly (not found by a glob at run time) so the
 * server bundle and the bundled scripts carry them. Append new ones; never edit an applied one.
 */
import type { QueryInterface } from 'sequelize';
import * as initial from './0001-initial';
import * as assetSideFiles from './0002-asset-side-files';
import * as mailNotifications from './0003-mail-notifications';
import * as longFindingNames from './0004-long-finding-names';

/** One schema change: a unique name (stored once applied) and how to apply and undo it. */
export interface Migration {
  name: string;
  up(queryInterface: QueryInterface): Promise<void>;
  down(queryInterface: QueryInterface): Promise<void>;
}

export const MIGRATIONS: readonly Migration[] = [initial, assetSideFiles, mailNotifications, longFindingNames];
