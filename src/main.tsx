import "@/styles/index.css";

import { StrictMode } from "react";
import { createRoot } from "react-dom/client";

import { App } from "@/app/app";

const root = document.getElementById("root");
if (!root) throw new Error("Lintel needs an element with id 'root' to start.");

createRoot(root).render(
  <StrictMode>
    <App />
  </StrictMode>,
);
