package saturation

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/lapack/lapack64"
	"gonum.org/v1/gonum/mat"
)

// TestSolveLinear compares solveLinear and solveFactored with gonum's dense
// solver on random systems and checks that a singular matrix is refused.
func TestSolveLinear(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	for trial := 0; trial < 50; trial++ {
		n := 1 + rng.IntN(20)
		a := make([]float64, n*n)
		b := make([]float64, n)
		for i := range a {
			a[i] = rng.NormFloat64()
		}
		for i := 0; i < n; i++ {
			b[i] = rng.NormFloat64()
		}
		A := mat.NewDense(n, n, append([]float64(nil), a...))
		if mat.Cond(A, 1) > 1e8 {
			continue
		}
		var want mat.VecDense
		if err := want.SolveVec(A, mat.NewVecDense(n, append([]float64(nil), b...))); err != nil {
			t.Fatal(err)
		}
		b2 := append([]float64(nil), b...)
		piv := make([]int, n)
		if !solveLinear(a, b, piv, n) {
			t.Fatalf("n=%d: reported singular", n)
		}
		solveFactored(a, b2, piv, n)
		for i := 0; i < n; i++ {
			w := want.AtVec(i)
			if math.Abs(b[i]-w) > 1e-8*(1+math.Abs(w)) || math.Abs(b2[i]-w) > 1e-8*(1+math.Abs(w)) {
				t.Errorf("n=%d x[%d] = %g (refactored %g), gonum %g", n, i, b[i], b2[i], w)
			}
		}
	}
	if solveLinear([]float64{1, 2, 2, 4}, []float64{1, 1}, make([]int, 2), 2) {
		t.Error("singular 2×2 matrix accepted")
	}
}

// BenchmarkLinearSolve: the solver's own elimination against gonum's
// lapack64 Getrf/Getrs on the Jacobian of the cooling-water test case.
func BenchmarkLinearSolve(b *testing.B) {
	sp := NewSpeciator(nil)
	if _, err := sp.Speciate(coolingWater(), Options{}); err != nil {
		b.Fatal(err)
	}
	s := sp.solver
	s.evaluate(true)
	n := len(s.vars) + 2
	a0, r0 := append([]float64(nil), s.jacobian[:n*n]...), append([]float64(nil), s.resid[:n]...)
	a, r, piv := make([]float64, len(a0)), make([]float64, len(r0)), make([]int, n)
	b.Run("elimination", func(b *testing.B) {
		for b.Loop() {
			copy(a, a0)
			copy(r, r0)
			solveLinear(a, r, piv, n)
		}
	})
	b.Run("lapack64", func(b *testing.B) {
		for b.Loop() {
			copy(a, a0)
			copy(r, r0)
			g := blas64.General{Rows: n, Cols: n, Stride: n, Data: a}
			lapack64.Getrf(g, piv)
			lapack64.Getrs(blas.NoTrans, g, blas64.General{Rows: n, Cols: 1, Stride: 1, Data: r}, piv)
		}
	})
}
