import { afterAll } from "vitest";

import { testApp } from "../helpers/app";

afterAll(async () => {
  await testApp().database.close();
});
