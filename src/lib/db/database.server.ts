import { serverConfig } from '../config.server';
import { createDatabase, type Database } from './client';

let shared: Database | undefined;

/** The server process's one database handle. */
export function database(): Database {
  shared ??= createDatabase(serverConfig().DATABASE_URL).db;
  return shared;
}
