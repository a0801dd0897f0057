/** Plain colours of our own for node states, shared by the 3D markers, the tree panel and the plots. */

export const STATE_COLOURS: Record<string, string> = {
  'bound-unstable': '#e0443e',
  unstable: '#f2a516',
  stable: '#7f9bb8',
};

export const STATE_LABELS: Record<string, string> = {
  'bound-unstable': 'bound and unstable',
  unstable: 'unstable, not bound',
  stable: 'stable',
};

/** Background of the 3D view (the browser test counts pixels that differ from it). */
export const VIEW_BACKGROUND = '#101418';
