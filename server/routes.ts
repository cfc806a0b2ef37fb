import { actionRoutes } from "./modules/actions/actions.router";
import { accountRoutes } from "./modules/accounts/accounts.router";
import { authRoutes } from "./modules/auth/auth.router";
import { auditRoutes } from "./modules/audits/audits.router";
import { committeeRoutes } from "./modules/committee/committee.router";
import { committeePressureRoutes } from "./modules/committee/pressure.router";
import { checklistRoutes } from "./modules/checklists/checklists.router";
import { floorRoutes } from "./modules/floors/floors.router";
import { identityRoutes } from "./modules/identity/identity.router";
import { imageRoutes } from "./modules/images/images.router";
import { devMailboxRoutes } from "./modules/dev-mailbox/dev-mailbox.router";
import { healthRoutes } from "./modules/health/health.router";
import { mailRoutes } from "./modules/mail/mail.router";
import { observationRoutes } from "./modules/observations/observations.router";
import { peopleRoutes } from "./modules/people/people.router";
import { pressureSiteRoutes } from "./modules/pressure/site.router";
import { pressureSettingsRoutes } from "./modules/pressure/settings.router";
import { pressureSpaceRoutes } from "./modules/pressure/space.router";
import { siteRoutes } from "./modules/sites/sites.router";
import { uploadTokenRoutes } from "./modules/pressure/upload-tokens.router";
import { uploadRoutes } from "./modules/pressure/uploads.router";

/** Every API route with its declared access: the server mounts these and the role matrix tests them. */
export const apiRoutes = [
  ...healthRoutes,
  ...devMailboxRoutes,
  ...authRoutes,
  ...identityRoutes,
  ...accountRoutes,
  ...siteRoutes,
  ...peopleRoutes,
  ...mailRoutes,
  ...floorRoutes,
  ...imageRoutes,
  ...checklistRoutes,
  ...auditRoutes,
  ...actionRoutes,
  ...committeeRoutes,
  ...committeePressureRoutes,
  ...observationRoutes,
  ...pressureSiteRoutes,
  ...pressureSettingsRoutes,
  ...pressureSpaceRoutes,
  ...uploadTokenRoutes,
  ...uploadRoutes,
];
