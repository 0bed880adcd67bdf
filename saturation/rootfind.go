package saturation

import (
	"errors"
	"math"
)

// errNoBracket reports a root search whose interval ends have the same
// sign.
var errNoBracket = errors.New("no sign change in the interval")

// findRoot returns x in [a, b] with f(x) = 0 to within tol in x, by Brent's
// method (inverse quadratic interpolation, secant and bisection), given
// that f(a) and f(b) differ in sign. An error from f stops the search.
//
// References: Brent, R.P. (1973) Algorithms for Minimization without
// Derivatives, ch. 4 (the zero algorithm).
func findRoot(f func(float64) (float64, error), a, b, tol float64) (float64, error) {
	fa, err := f(a)
	if err != nil {
		return 0, err
	}
	fb, err := f(b)
	if err != nil {
		return 0, err
	}
	if fa == 0 {
		return a, nil
	}
	if fb == 0 {
		return b, nil
	}
	if (fa > 0) == (fb > 0) {
		return 0, errNoBracket
	}
	c, fc := a, fa
	d := b - a
	e := d
	for iter := 0; iter < 100; iter++ {
		if (fb > 0) == (fc > 0) {
			c, fc = a, fa
			d = b - a
			e = d
		}
		if math.Abs(fc) < math.Abs(fb) {
			a, b, c = b, c, b
			fa, fb, fc = fb, fc, fb
		}
		tol1 := 2*1e-15*math.Abs(b) + tol/2
		xm := (c - b) / 2
		if math.Abs(xm) <= tol1 || fb == 0 {
			return b, nil
		}
		if math.Abs(e) >= tol1 && math.Abs(fa) > math.Abs(fb) {
			s := fb / fa
			var p, q float64
			if a == c {
				p = 2 * xm * s
				q = 1 - s
			} else {
				q = fa / fc
				r := fb / fc
				p = s * (2*xm*q*(q-r) - (b-a)*(r-1))
				q = (q - 1) * (r - 1) * (s - 1)
			}
			if p > 0 {
				q = -q
			}
			p = math.Abs(p)
			if 2*p < math.Min(3*xm*q-math.Abs(tol1*q), math.Abs(e*q)) {
				e = d
				d = p / q
			} else {
				d = xm
				e = d
			}
		} else {
			d = xm
			e = d
		}
		a, fa = b, fb
		if math.Abs(d) > tol1 {
			b += d
		} else if xm > 0 {
			b += tol1
		} else {
			b -= tol1
		}
		if fb, err = f(b); err != nil {
			return 0, err
		}
	}
	return b, nil
}
