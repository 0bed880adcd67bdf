package saturation

import "math"

// solveLinear solves the n×n system a·x = b in place by Gaussian
// elimination with partial pivoting: a (row-major, stride n) is
// overwritten by its LU factors, piv by the row interchanges, and b by x.
// It reports false when a pivot is zero or not finite (a singular or broken
// matrix). solveFactored then solves another right-hand side with the same
// factors (a chord step).
//
// For the 10–20 unknowns of a speciation this is faster than gonum's
// lapack64.Getrf/Getrs, whose blocked kernels and triangular solves with
// many right-hand sides pay off only for larger matrices:
// BenchmarkLinearSolve measures both on a Jacobian of the cooling-water
// test case (see DEVELOPERS.md for the figures).
func solveLinear(a, b []float64, piv []int, n int) bool {
	for k := 0; k < n; k++ {
		p, big := k, math.Abs(a[k*n+k])
		for i := k + 1; i < n; i++ {
			if v := math.Abs(a[i*n+k]); v > big {
				p, big = i, v
			}
		}
		if big == 0 || math.IsNaN(big) || math.IsInf(big, 0) {
			return false
		}
		piv[k] = p
		if p != k {
			rk, rp := a[k*n:(k+1)*n], a[p*n:(p+1)*n]
			for j := range rk {
				rk[j], rp[j] = rp[j], rk[j]
			}
		}
		rk := a[k*n : (k+1)*n]
		inv := 1 / rk[k]
		for i := k + 1; i < n; i++ {
			ri := a[i*n : (i+1)*n]
			f := ri[k] * inv
			ri[k] = f // the multiplier, kept for solveFactored
			if f == 0 {
				continue
			}
			for j := k + 1; j < n; j++ {
				ri[j] -= f * rk[j]
			}
		}
	}
	solveFactored(a, b, piv, n)
	return true
}

// solveFactored solves a·x = b in place with the factors solveLinear left
// in a and piv.
func solveFactored(a, b []float64, piv []int, n int) {
	// The row interchanges moved whole rows (multipliers included), so they
	// apply to b first, in order; then L (unit diagonal) and U.
	for k := 0; k < n; k++ {
		if p := piv[k]; p != k {
			b[k], b[p] = b[p], b[k]
		}
	}
	for k := 0; k < n; k++ {
		bk := b[k]
		for i := k + 1; i < n; i++ {
			b[i] -= a[i*n+k] * bk
		}
	}
	for k := n - 1; k >= 0; k-- {
		rk := a[k*n : (k+1)*n]
		v := b[k]
		for j := k + 1; j < n; j++ {
			v -= rk[j] * b[j]
		}
		b[k] = v / rk[k]
	}
}
