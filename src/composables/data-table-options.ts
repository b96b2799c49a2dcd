/** What a server-side Vuetify data table reports in `update:options`. */
export interface DataTableOptions {
  page: number
  itemsPerPage: number
  sortBy: readonly { key: string; order?: boolean | 'asc' | 'desc' }[]
}

/**
 * The page, page size and one sorted column a store asks the server for. A column the
 * server cannot sort by keeps `fallback`; anything but 'desc' sorts ascending.
 */
export function readTableOptions<K extends string>(
  options: DataTableOptions,
  sortableKeys: readonly K[],
  fallback: K,
): { page: number; pageSize: number; sort: K; order: 'asc' | 'desc' } {
  const [first] = options.sortBy
  const sort = sortableKeys.find((key) => key === first?.key) ?? fallback
  return { page: options.page, pageSize: options.itemsPerPage, sort, order: first?.order === 'desc' ? 'desc' : 'asc' }
}
