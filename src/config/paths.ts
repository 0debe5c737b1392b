/**
 * Every page's URL in one table. Screens build links with getHref so a route
 * can move without hunting for string literals.
 */
type Id = number | string;

/** Only same-site paths are honoured after sign-in, so a crafted link cannot send someone elsewhere. */
export function safeRedirect(target: string | null | undefined): string {
  if (!target || !target.startsWith('/') || target.startsWith('//') || target.startsWith('/\\')) return '/';
  return target;
}

export const paths = {
  home: {
    path: '/',
    getHref: () => '/',
  },
  auth: {
    signIn: {
      path: '/sign-in',
      getHref: (redirectTo?: string | null) =>
        redirectTo && redirectTo !== '/' ? `/sign-in?redirectTo=${encodeURIComponent(redirectTo)}` : '/sign-in',
    },
    forgotPassword: {
      path: '/forgot-password',
      getHref: () => '/forgot-password',
    },
    /** Opened from the reset mail; the link's token follows in the fragment (#…), which the browser never sends to a server. */
    resetPassword: {
      path: '/reset-password',
      getHref: (token?: string) => (token ? `/reset-password#${token}` : '/reset-password'),
    },
    /** Opened from the invitation mail, the token in the fragment as for a reset. */
    invitation: {
      path: '/invitation',
      getHref: (token?: string) => (token ? `/invitation#${token}` : '/invitation'),
    },
  },
  project: {
    root: {
      path: '/projects/:projectId',
      getHref: (projectId: Id) => `/projects/${projectId}`,
    },
    members: {
      path: '/projects/:projectId/members',
      getHref: (projectId: Id) => `/projects/${projectId}/members`,
    },
    newTarget: {
      path: '/projects/:projectId/targets/new',
      getHref: (projectId: Id) => `/projects/${projectId}/targets/new`,
    },
    target: {
      path: '/projects/:projectId/targets/:targetId',
      getHref: (projectId: Id, targetId: Id) => `/projects/${projectId}/targets/${targetId}`,
    },
    editTarget: {
      path: '/projects/:projectId/targets/:targetId/edit',
      getHref: (projectId: Id, targetId: Id) => `/projects/${projectId}/targets/${targetId}/edit`,
    },
    upload: {
      path: '/projects/:projectId/upload',
      getHref: (projectId: Id) => `/projects/${projectId}/upload`,
    },
    uploads: {
      path: '/projects/:projectId/uploads',
      getHref: (projectId: Id) => `/projects/${projectId}/uploads`,
    },
    uploadPreview: {
      path: '/projects/:projectId/uploads/:uploadId',
      getHref: (projectId: Id, uploadId: Id) => `/projects/${projectId}/uploads/${uploadId}`,
    },
    settings: {
      path: '/projects/:projectId/settings',
      getHref: (projectId: Id) => `/projects/${projectId}/settings`,
    },
    review: {
      path: '/projects/:projectId/review',
      /** With a target, the queue opens filtered to that target's values. */
      getHref: (projectId: Id, targetId?: Id) => `/projects/${projectId}/review${targetId === undefined ? '' : `?target=${targetId}`}`,
    },
    summary: {
      path: '/projects/:projectId/summary',
      getHref: (projectId: Id) => `/projects/${projectId}/summary`,
    },
    hr: {
      path: '/projects/:projectId/hr',
      getHref: (projectId: Id) => `/projects/${projectId}/hr`,
    },
    trail: {
      path: '/projects/:projectId/trail',
      /** With a target, the trail opens filtered to that target's entries. */
      getHref: (projectId: Id, targetId?: Id) => `/projects/${projectId}/trail${targetId === undefined ? '' : `?target=${targetId}`}`,
    },
  },
  account: {
    tokens: {
      path: '/account/tokens',
      getHref: () => '/account/tokens',
    },
    mail: {
      path: '/account/mail',
      getHref: () => '/account/mail',
    },
    password: {
      path: '/account/password',
      getHref: () => '/account/password',
    },
    sessions: {
      path: '/account/sessions',
      getHref: () => '/account/sessions',
    },
    secondFactor: {
      path: '/account/second-factor',
      getHref: () => '/account/second-factor',
    },
    data: {
      path: '/account/data',
      getHref: () => '/account/data',
    },
  },
  admin: {
    users: {
      path: '/admin/users',
      getHref: () => '/admin/users',
    },
    mail: {
      path: '/admin/mail',
      getHref: () => '/admin/mail',
    },
  },
  calculator: {
    path: '/calculator',
    getHref: () => '/calculator',
  },
  /** The API described for pipelines (signed-in people). */
  apiReference: {
    path: '/api-reference',
    getHref: () => '/api-reference',
  },
  /** The privacy notice: open to everyone, signed in or not. */
  privacy: {
    path: '/privacy',
    getHref: () => '/privacy',
  },
} as const;
