// The ids package.json contributes, in one place the host and the tests both read (the e2e
// tests drive the editor by these exact ids).

export const DISTANCE_REVIEW_VIEW_ID = 'loudword.distanceReview';

export const COMMAND_IDS = {
  reviewDistances: 'loudword.reviewDistances',
  addTermToStopList: 'loudword.addTermToStopList',
  addAllSuggested: 'loudword.addAllSuggested',
  exportHtmlReport: 'loudword.exportHtmlReport',
  openConfig: 'loudword.openConfig',
  toggleCorpusMarkers: 'loudword.toggleCorpusMarkers',
} as const;
