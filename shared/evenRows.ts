/**
 * Thinning a long series evenly: every k-th row, k as small as keeps at most `limit`,
 * always with the last. The calibration fit and the record's measured traces both thin
 * logger rows this way.
 */
export function evenRows(count: number, limit: number): number[] {
  const stride = Math.max(1, Math.ceil((count - 1) / (limit - 1)))
  const rows: number[] = []
  for (let i = 0; i < count; i += stride) rows.push(i)
  if (rows[rows.length - 1] !== count - 1) rows.push(count - 1)
  return rows
}
