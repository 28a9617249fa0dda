// Package simulate runs a scenario end to end: it resolves the plan (package synth),
// runs the pipeline over the selected chunks, and streams the batches into the
// requested catalogue writers (package output), with a sidecar manifest, per-band and
// per-stage counts, and optional summaries and pictures.
//
// It is the only place where the pipeline meets file formats, so that package synth
// stays free of I/O and package output free of physics.
package simulate
