// Sorting and filtering for the plain tables of Sites & rooms and People (client side: the lists are short).
export interface TableColumn<Row> {
  key: string
  label: string
  value: (row: Row) => string | number
}

export function useTableView<Row>(rows: Ref<Row[] | null | undefined>, columns: TableColumn<Row>[], initialKey: string) {
  const sortKey = ref(initialKey)
  const ascending = ref(true)
  const filter = ref('')

  function sortBy(key: string): void {
    if (sortKey.value === key) ascending.value = !ascending.value
    else {
      sortKey.value = key
      ascending.value = true
    }
  }

  const visible = computed(() => {
    const needle = filter.value.trim().toLowerCase()
    const column = columns.find((c) => c.key === sortKey.value) ?? columns[0]!
    const matching = (rows.value ?? []).filter((row) => !needle || columns.some((c) => String(c.value(row)).toLowerCase().includes(needle)))
    return [...matching].sort((a, b) => {
      const left = column.value(a)
      const right = column.value(b)
      const order = typeof left === 'number' && typeof right === 'number' ? left - right : String(left).localeCompare(String(right))
      return ascending.value ? order : -order
    })
  })

  const ariaSort = (key: string) => (sortKey.value === key ? (ascending.value ? 'ascending' : 'descending') : 'none')
  return { sortKey, ascending, filter, sortBy, visible, ariaSort }
}
