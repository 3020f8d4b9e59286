/** The invented demo team's accounts (local mode only). */
export const DEMO_PASSWORD = 'lanewise-demo';

export const DEMO_PROJECT_NAME = 'Harbor Ridge Radio Group — spiral structure';

export const DEMO_ACCOUNTS = [
  {
    email: 'admin@harborridge.example',
    name: 'Site Admin',
    siteRole: 'admin',
    projectRole: null,
    label: 'site admin',
  },
  {
    email: 'owner@harborridge.example',
    name: 'Mara Quell',
    siteRole: 'member',
    projectRole: 'owner',
    label: 'project owner',
  },
  {
    email: 'editor@harborridge.example',
    name: 'Tobin Reyes',
    siteRole: 'member',
    projectRole: 'editor',
    label: 'project editor',
  },
  {
    email: 'viewer@harborridge.example',
    name: 'Ilse Harrow',
    siteRole: 'member',
    projectRole: 'viewer',
    label: 'project viewer',
  },
] as const;
