/**
 * Every route path in one place. Pages link with `paths.x.getHref(...)`; the router uses `paths.x.path`.
 * A feature that needs more routes adds its entries here.
 */
export const paths = {
  home: { path: '/', getHref: () => '/' },
  auth: {
    signIn: { path: '/sign-in', getHref: (redirectTo?: string) => (redirectTo ? `/sign-in?redirectTo=${encodeURIComponent(redirectTo)}` : '/sign-in') },
    signUp: { path: '/sign-up', getHref: () => '/sign-up' },
    finishSignUp: { path: '/sign-up/finish/:token', getHref: (token: string) => `/sign-up/finish/${encodeURIComponent(token)}` },
    forgotPassword: { path: '/forgot-password', getHref: () => '/forgot-password' },
    resetPassword: { path: '/reset-password/:token', getHref: (token: string) => `/reset-password/${encodeURIComponent(token)}` },
    acceptInvitation: { path: '/invitations/:token', getHref: (token: string) => `/invitations/${encodeURIComponent(token)}` },
  },
  workspace: {
    root: { path: '/w/:workspaceId', getHref: (workspaceId: string) => `/w/${workspaceId}` },
    datasets: { path: '/w/:workspaceId/datasets', getHref: (workspaceId: string) => `/w/${workspaceId}/datasets` },
    dataset: { path: '/w/:workspaceId/datasets/:datasetId', getHref: (workspaceId: string, datasetId: string) => `/w/${workspaceId}/datasets/${datasetId}` },
    datasetVersion: {
      path: '/w/:workspaceId/datasets/:datasetId/versions/:number',
      getHref: (workspaceId: string, datasetId: string, number: number) => `/w/${workspaceId}/datasets/${datasetId}/versions/${number}`,
    },
    models: { path: '/w/:workspaceId/models', getHref: (workspaceId: string) => `/w/${workspaceId}/models` },
    newModel: { path: '/w/:workspaceId/models/new', getHref: (workspaceId: string) => `/w/${workspaceId}/models/new` },
    model: { path: '/w/:workspaceId/models/:modelId', getHref: (workspaceId: string, modelId: string) => `/w/${workspaceId}/models/${modelId}` },
    runFit: {
      path: '/w/:workspaceId/models/:modelId/run',
      /** `from`: a fit whose spec fills the form (the "change and run again" path). */
      getHref: (workspaceId: string, modelId: string, from?: string) => `/w/${workspaceId}/models/${modelId}/run${from ? `?from=${encodeURIComponent(from)}` : ''}`,
    },
    fit: { path: '/w/:workspaceId/fits/:fitId', getHref: (workspaceId: string, fitId: string) => `/w/${workspaceId}/fits/${fitId}` },
    reviews: { path: '/w/:workspaceId/reviews', getHref: (workspaceId: string) => `/w/${workspaceId}/reviews` },
    review: { path: '/w/:workspaceId/reviews/:reviewId', getHref: (workspaceId: string, reviewId: string) => `/w/${workspaceId}/reviews/${reviewId}` },
    /** Links to a comparison: `fits` in order, the first is the baseline. */
    compare: { path: '/w/:workspaceId/compare', getHref: (workspaceId: string, fitIds: string[] = []) => `/w/${workspaceId}/compare${fitIds.length ? `?fits=${fitIds.join(',')}` : ''}` },
    releases: { path: '/w/:workspaceId/releases', getHref: (workspaceId: string) => `/w/${workspaceId}/releases` },
    consumers: { path: '/w/:workspaceId/consumers', getHref: (workspaceId: string) => `/w/${workspaceId}/consumers` },
    members: { path: '/w/:workspaceId/members', getHref: (workspaceId: string) => `/w/${workspaceId}/members` },
    outbox: { path: '/w/:workspaceId/outbox', getHref: (workspaceId: string) => `/w/${workspaceId}/outbox` },
    account: { path: '/w/:workspaceId/account', getHref: (workspaceId: string) => `/w/${workspaceId}/account` },
  },
  newWorkspace: { path: '/new-workspace', getHref: () => '/new-workspace' },
} as const;
