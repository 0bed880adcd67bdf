// Package water describes a water sample as a laboratory reports it and as a
// plant changes it: totals of each component in mol/kg of water, temperature,
// pH and the temperature it was measured at, alkalinity and density; the units
// of the trade; data-quality checks (ion balance, TDS, conductivity, ionic
// strength estimates); and the transformations a plant applies (concentrate by
// cycles, blend, dose a reagent). It knows nothing of equilibrium constants:
// speciation lives in package saturation.
package water
