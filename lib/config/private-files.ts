// Storage is readable by the account the server runs as, and no one else: folders 0700, files 0600. New files
// get these modes from the server's umask (server-process.ts); this brings what is already there in line.
import { chmodSync, existsSync, lstatSync, readdirSync } from 'node:fs';
import path from 'node:path';

export const PRIVATE_FILE_MODE = 0o600;
export const PRIVATE_DIR_MODE = 0o700;

function makePrivate(target: string): void {
  const stats = lstatSync(target);
  if (stats.isSymbolicLink()) return;
  if (stats.isDirectory()) {
    chmodSync(target, PRIVATE_DIR_MODE);
    for (const name of readdirSync(target)) makePrivate(path.join(target, name));
  } else {
    chmodSync(target, PRIVATE_FILE_MODE);
  }
}

/** Makes the storage folder (recursively) and the database file with its journal private. */
export function makeStoragePrivate(storageDir: string, databasePath: string): void {
  for (const target of [storageDir, databasePath, `${databasePath}-wal`, `${databasePath}-shm`]) {
    if (existsSync(target)) makePrivate(target);
  }
}
