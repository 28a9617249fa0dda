// Package phot turns a star's luminosity, temperature, gravity and metallicity
// into absolute magnitudes in standard photometric systems, and labels it with
// a spectral type and luminosity class.
package phot
