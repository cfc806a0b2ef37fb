import type { ReactNode } from "react";

import { cn } from "@/lib/cn";

export interface IconProps {
  className?: string;
}

/** The frame every outline icon shares: a 24-unit grid drawn in the current text colour. */
function OutlineIcon({ className, children }: IconProps & { children: ReactNode }) {
  return (
    <svg
      aria-hidden="true"
      viewBox="0 0 24 24"
      fill="none"
      stroke="currentColor"
      strokeWidth="1.8"
      strokeLinecap="round"
      strokeLinejoin="round"
      className={cn("size-6", className)}
    >
      {children}
    </svg>
  );
}

/** A building with a doorway: the sites a person works at. */
export function SitesIcon({ className }: IconProps) {
  return (
    <OutlineIcon className={className}>
      <path d="M4 21V5.5A1.5 1.5 0 0 1 5.5 4h9A1.5 1.5 0 0 1 16 5.5V21" />
      <path d="M16 10h2.5A1.5 1.5 0 0 1 20 11.5V21" />
      <path d="M2.5 21h19" />
      <path d="M8.5 21v-4h3v4" />
      <path d="M7.5 8h1M11.5 8h1M7.5 12h1M11.5 12h1" />
    </OutlineIcon>
  );
}

/** A head and shoulders: the signed-in person's own page. */
export function AccountIcon({ className }: IconProps) {
  return (
    <OutlineIcon className={className}>
      <circle cx="12" cy="8.5" r="3.75" />
      <path d="M4.5 20.5c.9-3.6 3.9-5.75 7.5-5.75s6.6 2.15 7.5 5.75" />
    </OutlineIcon>
  );
}

export function ClockIcon({ className }: IconProps) {
  return (
    <svg
      aria-hidden="true"
      viewBox="0 0 20 20"
      fill="none"
      stroke="currentColor"
      strokeWidth="1.6"
      strokeLinecap="round"
      className={cn("size-4", className)}
    >
      <circle cx="10" cy="10" r="7.25" />
      <path d="M10 6v4.25l2.75 1.75" />
    </svg>
  );
}

export function PinIcon({ className }: IconProps) {
  return (
    <svg
      aria-hidden="true"
      viewBox="0 0 20 20"
      fill="none"
      stroke="currentColor"
      strokeWidth="1.6"
      strokeLinejoin="round"
      className={cn("size-4", className)}
    >
      <path d="M10 18s-5.5-5.2-5.5-9.25a5.5 5.5 0 0 1 11 0C15.5 12.8 10 18 10 18Z" />
      <circle cx="10" cy="8.75" r="2" />
    </svg>
  );
}

/** Two heads: the people an administrator looks after. */
export function PeopleIcon({ className }: IconProps) {
  return (
    <OutlineIcon className={className}>
      <circle cx="9" cy="8.5" r="3.25" />
      <path d="M2.75 19.5c.8-3.1 3.3-5 6.25-5s5.45 1.9 6.25 5" />
      <path d="M15.5 5.6a3.25 3.25 0 0 1 0 5.8" />
      <path d="M17.25 14.75c2 .55 3.45 2.2 4 4.75" />
    </OutlineIcon>
  );
}

/** An envelope: the mail Lintel has sent. */
export function MailIcon({ className }: IconProps) {
  return (
    <OutlineIcon className={className}>
      <rect x="3" y="5.5" width="18" height="13" rx="2" />
      <path d="m3.75 7 8.25 6 8.25-6" />
    </OutlineIcon>
  );
}

/** A clipboard with ticks: the checklists an audit follows. */
export function ChecklistIcon({ className }: IconProps) {
  return (
    <OutlineIcon className={className}>
      <path d="M9 4.5H6.5A1.5 1.5 0 0 0 5 6v13.5A1.5 1.5 0 0 0 6.5 21h11a1.5 1.5 0 0 0 1.5-1.5V6a1.5 1.5 0 0 0-1.5-1.5H15" />
      <rect x="9" y="3" width="6" height="3" rx="1" />
      <path d="m8.5 11 1.5 1.5 2.5-2.5M8.5 16.5l1.5 1.5 2.5-2.5M14.5 11.5h1.5M14.5 17h1.5" />
    </OutlineIcon>
  );
}

/** An eye over numbered lines: the steps an observer reads aloud and watches. */
export function ObservationIcon({ className }: IconProps) {
  return (
    <OutlineIcon className={className}>
      <path d="M3 8c2.2-3.3 5.2-5 9-5s6.8 1.7 9 5c-2.2 3.3-5.2 5-9 5s-6.8-1.7-9-5Z" />
      <circle cx="12" cy="8" r="2" />
      <path d="M4 16.5h1.5M9 16.5h11M4 20.5h1.5M9 20.5h11" />
    </OutlineIcon>
  );
}

/** A camera: taking a photo of what the audit found. */
export function CameraIcon({ className }: IconProps) {
  return (
    <OutlineIcon className={className}>
      <path d="M4 8.5A1.5 1.5 0 0 1 5.5 7h2.2l1.5-2h5.6l1.5 2h2.2A1.5 1.5 0 0 1 20 8.5v9a1.5 1.5 0 0 1-1.5 1.5h-13A1.5 1.5 0 0 1 4 17.5Z" />
      <circle cx="12" cy="13" r="3.5" />
    </OutlineIcon>
  );
}

/** A clipboard with a tick: corrective actions to see through. */
export function ActionsIcon({ className }: IconProps) {
  return (
    <OutlineIcon className={className}>
      <rect x="5" y="4.5" width="14" height="17" rx="2" />
      <path d="M9 4.5V3h6v1.5" />
      <path d="m8.5 13 2.5 2.5 4.5-5" />
    </OutlineIcon>
  );
}

/** Dots with whiskers over a baseline: sites compared with their intervals. */
export function CommitteeIcon({ className }: IconProps) {
  return (
    <OutlineIcon className={className}>
      <path d="M3 20.5h18" />
      <path d="M7 8v8M12 5v8M17 10v7" />
      <path d="M6 8h2M6 16h2M11 5h2M11 13h2M16 10h2M16 17h2" />
      <circle cx="7" cy="12" r="1.4" />
      <circle cx="12" cy="9" r="1.4" />
      <circle cx="17" cy="13.5" r="1.4" />
    </OutlineIcon>
  );
}

/** Three sliders: the administrator's pages (people, checklists, mail) gathered in one place. */
export function AdminIcon({ className }: IconProps) {
  return (
    <OutlineIcon className={className}>
      <path d="M4 6.5h9M17 6.5h3M4 12h3M11 12h9M4 17.5h11M19 17.5h1" />
      <circle cx="15" cy="6.5" r="2" />
      <circle cx="9" cy="12" r="2" />
      <circle cx="17" cy="17.5" r="2" />
    </OutlineIcon>
  );
}

/** A key: how people sign in (the network's identity provider, passwords). */
export function KeyIcon({ className }: IconProps) {
  return (
    <OutlineIcon className={className}>
      <circle cx="8" cy="15" r="4.5" />
      <path d="M11.2 11.8 20 3M16.5 6.5l2.5 2.5M14 9l2 2" />
    </OutlineIcon>
  );
}
