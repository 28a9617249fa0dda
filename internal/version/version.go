// Package version holds the tool's version string, recorded in every output's metadata.
package version

// Version is the starmock release. It is written into run manifests and file metadata so
// a catalogue can always be traced to the code that made it.
const Version = "0.1.0"
