package uncertain

import (
	"math"

	"gonum.org/v1/gonum/mat"
)

// Budget is the list of raw inputs of one calculation: each with its name,
// its value and its standard uncertainty, all in base units.
type Budget struct {
	names  []string
	values []float64
	u      []float64
}

// Input adds a raw input with value x and standard uncertainty u (≥ 0) and
// returns it as a Number whose only sensitivity is 1 to itself.
func (b *Budget) Input(name string, x, u float64) Number {
	i := len(b.names)
	b.names = append(b.names, name)
	b.values = append(b.values, x)
	b.u = append(b.u, u)
	g := make([]float64, i+1)
	g[i] = 1
	return Number{Value: x, grad: g}
}

// Len is the number of raw inputs.
func (b *Budget) Len() int { return len(b.names) }

// Name is the name of raw input i.
func (b *Budget) Name(i int) string { return b.names[i] }

// StdU is the standard uncertainty of raw input i.
func (b *Budget) StdU(i int) float64 { return b.u[i] }

// U is the combined standard uncertainty of y, JCGM 100:2008 Eq. (10):
// u²(y) = Σ cᵢ² u²(xᵢ) over the raw inputs, which are uncorrelated.
func (b *Budget) U(y Number) float64 { return math.Sqrt(b.Covariance(y, y)) }

// Covariance of two results y and z, JCGM 100:2008 Eq. (F.2) with
// uncorrelated inputs: u(y, z) = Σ (∂y/∂xᵢ)(∂z/∂xᵢ) u²(xᵢ).
func (b *Budget) Covariance(y, z Number) float64 {
	var c float64
	for i := range min(len(y.grad), len(z.grad), len(b.u)) {
		c += y.grad[i] * z.grad[i] * b.u[i] * b.u[i]
	}
	return c
}

// Jacobian returns the sensitivities of the results ys with respect to the
// raw inputs: row j, column i is ∂yⱼ/∂xᵢ.
func (b *Budget) Jacobian(ys []Number) *mat.Dense {
	j := mat.NewDense(len(ys), max(1, len(b.names)), nil)
	for r, y := range ys {
		for c := range min(len(y.grad), len(b.names)) {
			j.Set(r, c, y.grad[c])
		}
	}
	return j
}

// CovarianceMatrix returns J Σ Jᵀ, the covariance matrix of the results
// ys (JCGM 101:2008 Eq. (3) in the linear case; JCGM 100:2008 Eq. (F.2)),
// with Σ the diagonal matrix of the raw inputs' variances.
func (b *Budget) CovarianceMatrix(ys []Number) *mat.SymDense {
	j := b.Jacobian(ys)
	n := max(1, len(b.u))
	d := make([]float64, n)
	for i := range b.u {
		d[i] = b.u[i] * b.u[i]
	}
	var js mat.Dense
	js.Mul(j, mat.NewDiagDense(n, d))
	var c mat.Dense
	c.Mul(&js, j.T())
	out := mat.NewSymDense(len(ys), nil)
	for r := range len(ys) {
		for k := r; k < len(ys); k++ {
			out.SetSym(r, k, c.At(r, k))
		}
	}
	return out
}

// Contribution is one raw input's share of a result's uncertainty: its
// sensitivity coefficient c = ∂y/∂x and |c|·u(x), JCGM 100:2008 Eq. (11).
type Contribution struct {
	Name        string
	Sensitivity float64
	U           float64 // |c|·u(x), in the unit of the result
}

// Contributions lists the shares of y's uncertainty from each raw input
// with a standard uncertainty, in the order the inputs were added.
func (b *Budget) Contributions(y Number) []Contribution {
	var out []Contribution
	for i, u := range b.u {
		if u == 0 {
			continue
		}
		c := y.Sensitivity(i)
		out = append(out, Contribution{Name: b.names[i], Sensitivity: c, U: math.Abs(c) * u})
	}
	return out
}

// Number is a value with its sensitivity coefficients with respect to the
// raw inputs of its Budget. The zero Number is the constant 0.
type Number struct {
	Value float64
	grad  []float64 // ∂Value/∂xᵢ; shorter than the budget means zeros
}

// Const is a value that depends on no input.
func Const(v float64) Number { return Number{Value: v} }

// Sensitivity returns ∂y/∂xᵢ.
func (y Number) Sensitivity(i int) float64 {
	if i < len(y.grad) {
		return y.grad[i]
	}
	return 0
}

// combine returns the Number of value v whose sensitivities are
// ca·a' + cb·b', the chain rule for v = f(a, b) with ∂f/∂a = ca, ∂f/∂b = cb.
func combine(v float64, a Number, ca float64, b Number, cb float64) Number {
	n := max(len(a.grad), len(b.grad))
	if n == 0 {
		return Number{Value: v}
	}
	g := make([]float64, n)
	for i := range a.grad {
		g[i] = ca * a.grad[i]
	}
	for i := range b.grad {
		g[i] += cb * b.grad[i]
	}
	return Number{Value: v, grad: g}
}

// Add returns y + z.
func (y Number) Add(z Number) Number { return combine(y.Value+z.Value, y, 1, z, 1) }

// Sub returns y − z.
func (y Number) Sub(z Number) Number { return combine(y.Value-z.Value, y, 1, z, -1) }

// Mul returns y·z.
func (y Number) Mul(z Number) Number { return combine(y.Value*z.Value, y, z.Value, z, y.Value) }

// Div returns y/z.
func (y Number) Div(z Number) Number {
	return combine(y.Value/z.Value, y, 1/z.Value, z, -y.Value/(z.Value*z.Value))
}

// Apply returns f(y) given its value fy and derivative dfy at y.
func (y Number) Apply(fy, dfy float64) Number { return combine(fy, y, dfy, Number{}, 0) }

// Linear2 returns the Number of value v that depends on a and b with the
// sensitivities ca = ∂v/∂a and cb = ∂v/∂b.
func Linear2(v float64, a Number, ca float64, b Number, cb float64) Number {
	return combine(v, a, ca, b, cb)
}
