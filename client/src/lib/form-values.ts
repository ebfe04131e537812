/**
 * Register options for a number box (or a select of ids) where empty means "none": the form value
 * is null rather than NaN or "", so a nullable schema accepts it and a required one says "required".
 */
export const emptyAsNull = {
  setValueAs: (value: string | number | null | undefined): number | null => (value === '' || value == null ? null : Number(value)),
};
