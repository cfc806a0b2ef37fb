import { startTestCluster } from "./test-cluster";

// Runs once for the API project: workers inherit DATABASE_URL from this process's environment.
export default async function setup() {
  const { cluster, url } = await startTestCluster("api");
  process.env.DATABASE_URL = url;
  return () => cluster.destroy();
}
