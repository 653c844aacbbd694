// Thinning a long series for a chart: per pixel column of time, the samples of least and
// greatest value, in the order they came (min/max decimation, common practice, no
// source). However many samples a flight has, the chart draws at most two points per
// column, and every peak and trough survives: the highest sample is always drawn.

/**
 * The points to draw of `values` against `times` (strictly increasing) in a chart
 * `columns` wide: `{times, values, count}`, where the first `count` entries hold the
 * points in time order and a NaN value marks a gap (a column where the series is not
 * defined, such as Mach above 86 km). A series of at most `2 * columns` samples comes
 * back whole. Never spreads the series into `Math.min`/`Math.max` (which throw for
 * arrays of more than about 125 000 elements).
 */
export function thin(times, values, columns) {
  const n = times.length;
  if (n <= 2 * columns) {
    return { times: Float64Array.from(times), values: Float64Array.from(values), count: n };
  }
  const outTimes = new Float64Array(2 * columns);
  const outValues = new Float64Array(2 * columns);
  let count = 0;
  const push = (t, v) => {
    outTimes[count] = t;
    outValues[count] = v;
    count++;
  };
  const t0 = times[0];
  const span = times[n - 1] - t0;
  let column = -1;
  let low = -1;
  let high = -1;
  let start = 0;
  const flush = () => {
    if (column < 0) return;
    if (low < 0) {
      // Nothing defined in this column: a gap, drawn as a break in the line.
      push(times[start], Number.NaN);
    } else if (low === high) {
      push(times[low], values[low]);
    } else {
      const [a, b] = low < high ? [low, high] : [high, low];
      push(times[a], values[a]);
      push(times[b], values[b]);
    }
  };
  for (let i = 0; i < n; i++) {
    const c = Math.min(columns - 1, Math.floor(((times[i] - t0) / span) * columns));
    if (c !== column) {
      flush();
      column = c;
      low = -1;
      high = -1;
      start = i;
    }
    const v = values[i];
    if (Number.isNaN(v)) continue;
    if (low < 0 || v < values[low]) low = i;
    if (high < 0 || v > values[high]) high = i;
  }
  flush();
  return { times: outTimes, values: outValues, count };
}

/** The largest value of a series, NaN skipped (a loop, not a spread); -Infinity when none. */
export function largest(values) {
  let best = -Infinity;
  for (const v of values) if (v > best) best = v;
  return best;
}
