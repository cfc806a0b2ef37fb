import { configure } from "@testing-library/dom";

import { cleanup } from "@testing-library/react";
import { afterEach } from "vitest";

// Pages load their modules lazily; on a busy two-core machine the first render can take seconds.
configure({ asyncUtilTimeout: 4000 });

afterEach(() => {
  cleanup();
});
