import sqlite3 from 'sqlite3';
import { Sequelize, Transaction } from 'sequelize';
import { defineModels, type Models } from '@/models';
import { readConfig } from '../config/environment';

export interface Database {
  sequelize: Sequelize;
  models: Models;
  /**
   * Runs `work` in one transaction that holds the write lock from its start. Every write goes through here:
   * writes of one process take turns, because a writer waiting on SQLite's busy timeout blocks one of libuv's
   * four threads, and a few of them at once would starve the writer they wait for.
   */
  write<T>(work: (transaction: Transaction) => Promise<T>): Promise<T>;
}

const CONNECTION_PRAGMAS = [
  'PRAGMA journal_mode = WAL',
  'PRAGMA busy_timeout = 5000',
  'PRAGMA foreign_keys = ON',
  'PRAGMA synchronous = NORMAL',
].join(';');

type OpenCallback = (error: Error | null) => void;

/**
 * sqlite3 with every new connection tuned before Sequelize gets it. Sequelize opens one connection per
 * transaction and runs no connect hooks for SQLite, so the pragmas are applied here, where each one is opened.
 */
const tunedSqlite3 = {
  ...sqlite3,
  Database: function TunedDatabase(file: string, mode: number, callback: OpenCallback) {
    const connection: sqlite3.Database = new sqlite3.Database(file, mode, (openError) => {
      if (openError) return callback(openError);
      connection.exec(CONNECTION_PRAGMAS, callback);
    });
    return connection;
  },
};

/** Opens a new connection to the SQLite file and defines the models on it. Call `sequelize.close()` when done. */
export function openDatabase(databasePath: string): Database {
  const sequelize = new Sequelize({
    dialect: 'sqlite',
    dialectModule: tunedSqlite3,
    storage: databasePath,
    logging: false,
    // IMMEDIATE takes the write lock at BEGIN, so two writers wait on busy_timeout instead of deadlocking.
    transactionType: Transaction.TYPES.IMMEDIATE,
  });
  let turn: Promise<unknown> = Promise.resolve();
  const write = <T>(work: (transaction: Transaction) => Promise<T>): Promise<T> => {
    const result = turn.then(() => sequelize.transaction(work));
    turn = result.catch(() => undefined);
    return result;
  };
  return { sequelize, models: defineModels(sequelize), write };
}

const processWideKey = Symbol.for('splitfield.database');
type ProcessWide = typeof globalThis & { [processWideKey]?: Database };

/**
 * The server's connection, shared by every route of the process. Kept on globalThis because the bundler may
 * load this module once per route bundle; the schema is brought up to date by `npm start`, not here.
 */
export function db(): Database {
  const holder = globalThis as ProcessWide;
  holder[processWideKey] ??= openDatabase(readConfig().databasePath);
  return holder[processWideKey];
}
