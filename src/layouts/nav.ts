import type { Role } from '@/api/types';

export interface NavItem {
  /** Route name; the item only shows once a route with this name exists. */
  to: string;
  label: string;
  icon: string;
  role?: Role;
  devOnly?: boolean;
}

/** Main navigation. Document and review routes appear here as their issues add them. */
export const NAV_ITEMS: NavItem[] = [
  { to: 'home', label: 'Look up', icon: 'search' },
  { to: 'browse', label: 'Browse', icon: 'category' },
  { to: 'connectors', label: 'Connectors', icon: 'settings_input_component' },
  { to: 'adapters', label: 'Adapters', icon: 'cable' },
  { to: 'writeups', label: 'Write-ups', icon: 'article' },
  { to: 'my-documents', label: 'My documents', icon: 'folder_open', role: 'member' },
  { to: 'review-queue', label: 'Review queue', icon: 'fact_check', role: 'moderator' },
  { to: 'review-flags', label: 'Flags', icon: 'flag', role: 'moderator' },
  { to: 'admin-members', label: 'Admin', icon: 'admin_panel_settings', role: 'admin' },
  { to: 'dev-mailbox', label: 'Mailbox', icon: 'inbox', devOnly: true },
];
