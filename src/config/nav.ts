// The navigation, in order. Each entry names the capability (shared/auth/capabilities.ts) a role
// needs to see it; the server checks the same capabilities on its routes.
import type { Capability } from '@shared/auth/capabilities';
import { paths } from './paths';

export interface NavItem {
  label: string;
  to: string;
  capability: Capability;
  /** What the screen is for, in a few words (shown as a hint on wide screens). */
  hint: string;
}

export const NAV_ITEMS: readonly NavItem[] = [
  { label: 'Bench', to: paths.app.bench.getHref(), capability: 'read', hint: 'Quick measure' },
  { label: 'Parts', to: paths.app.parts.getHref(), capability: 'read', hint: 'Every part and its history' },
  { label: 'Lots', to: paths.app.lots.getHref(), capability: 'read', hint: 'Incoming batches' },
  { label: 'Compare', to: paths.app.compare.getHref(), capability: 'read', hint: 'Tapers side by side' },
  { label: 'Harness', to: paths.app.harness.getHref(), capability: 'read', hint: 'Wiring designs' },
  { label: 'Jobs', to: paths.app.jobs.getHref(), capability: 'read', hint: 'Customer work' },
  // QA leads open Team for the tolerance profiles and instruments; members stay admin-only inside.
  { label: 'Team', to: paths.app.team.getHref(), capability: 'qa', hint: 'Members, profiles, instruments' },
  { label: 'Outbox', to: paths.app.outbox.getHref(), capability: 'admin', hint: 'Mail sent by Lugbook' },
];
