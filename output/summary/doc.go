// Package summary holds the streaming accumulators that summarise a run
// without keeping its rows: fixed-bin 1-D histograms (star counts per
// magnitude bin, per band, component and evolutionary stage, with cumulative
// counts N(<m)), 2-D Hess histograms (colour × magnitude, per component), and
// a capped random sample of points for plots. Everything merges exactly, so
// per-worker or per-shard accumulators combine to the numbers of one run, and
// every writer (CSV, JSON) emits its keys in a fixed order: the same contents
// give the same bytes.
//
// # Counts and uncertainties
//
// Each histogram keeps two quantities per bin: realised counts N (one per
// Add) with the Poisson uncertainty sqrt(N), and expected counts E = Σ w
// (AddExpected; w = expected number of stars, e.g. a detection probability)
// with the uncertainty sqrt(Σ w²). Both are common practice for counting
// statistics and weighted histograms. Weight sums are held as 128-bit
// fixed-point integers (64 fractional bits), so their merges are associative
// and commutative, hence exact; each weight is truncated to a multiple of
// 2⁻⁶⁴ on entry.
//
// Values outside the binning are kept in underflow/overflow (1-D) or outside
// (2-D) counters and NaN values in a NaN counter; cumulative counts include the
// underflow, so N(<m) counts every star brighter than m.
//
// # Sampling
//
// Reservoir keeps a uniform sample without replacement of at most k points by
// random priorities (bottom-k): one r.Uint64 per offered point. When the
// pipeline draws these from its per-chunk streams, sharded and unsharded runs
// keep the same points.
//
// # References
//
//   - Vitter, J. S. 1985, ACM Trans. Math. Softw. 11, 37, "Random sampling with
//     a reservoir" (doi:10.1145/3147.3165) — reservoir sampling (from memory).
//   - Efraimidis, P. S. & Spirakis, P. G. 2006, Inf. Process. Lett. 97, 181,
//     "Weighted random sampling with a reservoir"
//     (doi:10.1016/j.ipl.2005.11.003) — sampling by random keys, used here with
//     unit weights (from memory).
//
// # Incomplete
//
// Only fixed-width bins; no variable-width or logarithmic bins; no online
// means or variances (not needed by the current outputs).
package summary
