import type { TestProject } from 'vitest/node';
import { buildOnce, removeDir, startServer } from './server';

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
  }
}

/** One built server with a fresh, seeded store for the whole integration suite. */
export default async function setup(project: TestProject) {
  buildOnce();
  const server = await startServer();
  project.provide('baseUrl', server.baseUrl);
  return async () => {
    await server.stop();
    if (!process.env.DATABASE_URL) removeDir(server.dataDir);
  };
}
