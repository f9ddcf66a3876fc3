import type { TestProject } from 'vitest/node';
import { prepareTestTemplate, startTestCluster, TEMPLATE_DB } from './test-cluster';

declare module 'vitest' {
  export interface ProvidedContext {
    testDb: {
      adminUrl: string;
      template: string;
      urlPrefix: string;
      appUrlPrefix: string;
      appPassword: string;
      dataDir: string;
      port: number;
    };
  }
}

/** Provides the test cluster to the API and browser tests; prepares it when vitest runs alone. */
export default async function setup(project: TestProject) {
  const cluster = process.env.BW_TEST_PREPARED ? startTestCluster() : (await prepareTestTemplate()).cluster;
  project.provide('testDb', {
    adminUrl: cluster.adminUrl,
    template: TEMPLATE_DB,
    urlPrefix: cluster.urlFor(''),
    appUrlPrefix: cluster.appUrlFor(''),
    appPassword: cluster.appPassword,
    dataDir: cluster.dataDir,
    port: cluster.port,
  });
}
