/** Addresses of the instrument register pages; route definitions use `pattern`, links use `href`. */
export const instrumentPaths = {
  instruments: { pattern: '/instruments', href: () => '/instruments' },
  newInstrument: { pattern: '/instruments/new', href: () => '/instruments/new' },
  instrument: { pattern: '/instruments/:instrumentId', href: (id: number) => `/instruments/${id}` },
  editInstrument: { pattern: '/instruments/:instrumentId/edit', href: (id: number) => `/instruments/${id}/edit` },
} as const;
