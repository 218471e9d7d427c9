/** Where a drop's own page is (photo, fit, revisions). */
export const dropHref = (dropId: string) => `/drops/${encodeURIComponent(dropId)}`;

/** The measurement workspace with these photos opened (a saved drop keeps its session there). */
export const workspaceHref = (photoIds: string[]) =>
  `/measure?photos=${photoIds.map(encodeURIComponent).join(',')}`;
