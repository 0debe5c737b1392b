/*
 * The export of one's own data is a plain link to the API (the browser saves
 * the attachment the server sends, named starledger-account-<date>.json), so
 * this is an address, not a fetcher.
 */
export const ACCOUNT_EXPORT_HREF = '/api/account/export';
