// Package saturation computes the equilibrium state of a water: the
// thermodynamic table and its log K(T), activity models, the speciation
// solver, saturation indices of minerals and the carbonate system the way a
// practitioner measures it (alkalinity and pH at the measurement
// temperature). It builds on package water, which knows what a sample is.
package saturation
