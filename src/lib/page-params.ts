/*
 * A paged list keeps its page and page size in the address bar, so a page
 * can be bookmarked or sent and Back returns to it. The target table, the
 * review queue and the trail read and write them the same way, from here.
 */

/** The page sizes every paged list offers, so the lists read alike; the first is the default, as in the shared list query. */
export const PAGE_SIZES = [25, 50, 100] as const;

export interface PageParams {
  page: number;
  pageSize: number;
}

/** The page and page size in the address; a missing or odd one reads as the first page and the default size. */
export function readPageParams(search: URLSearchParams): PageParams {
  const page = Number.parseInt(search.get('page') ?? '', 10);
  const pageSize = Number.parseInt(search.get('pageSize') ?? '', 10);
  return {
    page: Number.isSafeInteger(page) && page >= 1 ? page : 1,
    pageSize: (PAGE_SIZES as readonly number[]).includes(pageSize) ? pageSize : PAGE_SIZES[0],
  };
}

/** Adds the page and page size to an address, leaving out the defaults so a plain list keeps a plain address. */
export function writePageParams(search: URLSearchParams, { page, pageSize }: PageParams): void {
  if (page !== 1) search.set('page', String(page));
  if (pageSize !== PAGE_SIZES[0]) search.set('pageSize', String(pageSize));
}
