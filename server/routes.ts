import { authRoutes } from "./modules/auth/auth.router";
import { healthRoutes } from "./modules/health/health.router";
import { siteRoutes } from "./modules/sites/sites.router";

/** Every API route with its declared access: the server mounts these and the role matrix tests them. */
export const apiRoutes = [...healthRoutes, ...authRoutes, ...siteRoutes];
