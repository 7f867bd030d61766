import type { TestProject } from 'vitest/node';
import { buildOnce, removeDir, startServer } from './server';

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
    /** The suite server's data directory (in server mode it names its database: server.ts). */
    dataDir: string;
  }
}

/** One built server with a fresh, seeded store for the whole integration suite. */
export default async function setup(project: TestProject) {
  buildOnce();
  const server = await startServer();
  project.provide('baseUrl', server.baseUrl);
  project.provide('dataDir', server.dataDir);
  return async () => {
    await server.stop();
    if (!process.env.DATABASE_URL) removeDir(server.dataDir);
  };
}
