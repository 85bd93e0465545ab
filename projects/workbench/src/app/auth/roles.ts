import type { Permission, Role } from '@counterpoise/api';

/** How each role is named on screen. */
export const ROLE_LABELS: Readonly<Record<Role, string>> = {
  owner: 'Owner',
  manager: 'Manager',
  technician: 'Technician',
  developer: 'Developer',
  viewer: 'Viewer',
};

/** One line on what a person in each role does, for choosing a role. */
export const ROLE_SUMMARIES: Readonly<Record<Role, string>> = {
  owner: 'Runs the organisation: people and their roles, API keys, and every job.',
  manager: 'Plans and checks the work of the shop, and invites technicians and viewers.',
  technician: 'Does the balancing jobs: machines, readings, corrections and reports.',
  developer: 'Connects other software through API keys and follows their use.',
  viewer: 'Reads jobs and reports without changing them.',
};

/** What each permission lets a person do, completing the sentence "You can …". */
export const PERMISSION_LABELS: Readonly<Record<Permission, string>> = {
  'organisation:manage': 'change the settings of the organisation',
  'people:read': 'see the people of the organisation',
  'people:invite': 'invite people',
  'people:manage': 'change roles, and deactivate or reactivate people',
  'jobs:read': 'read balancing jobs',
  'jobs:write': 'record your own balancing jobs',
  'jobs:write-any': 'edit anyone’s balancing jobs',
  'records:read': 'see customers, machines and machine families',
  'machines:write': 'add and edit machines',
  'customers:write': 'add and edit customers',
  'families:write': 'add and edit machine families',
  'records:archive': 'archive and restore customers, machines and families',
  'reports:read': 'read and print reports',
  'keys:manage': 'create and revoke API keys',
  'usage:read': 'follow the use of the API',
  'outbox:read': 'read the e-mail the server has sent',
  'docs:read': 'read the API reference',
  'calc:use': 'use the balancing calculator',
};
