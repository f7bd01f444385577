// Package uncertain propagates the standard uncertainties of measured
// inputs through states of water and steam and through the calculations
// built on them, by the law of propagation of uncertainty of JCGM 100:2008
// (GUM), section 5.1, Eq. (10), for uncorrelated inputs.
//
// A calculation starts from a Budget, which names each raw input with its
// value and standard uncertainty and hands back a Number. A Number carries
// its value and its sensitivity coefficients ∂y/∂xᵢ (GUM 5.1.3, Eq. 11a)
// with respect to every raw input of the budget, so a result computed from
// Numbers holds the full Jacobian row of the result with respect to the
// measurements: inputs that two intermediate values share stay correlated
// the way the calculation makes them (an efficiency's u comes from its four
// measurements, not from h1, h2 and h2s as if they were independent).
//
// Solve fixes a state from two uncertain inputs. The sensitivities come
// from the equations' own derivatives: with the state written in (p, T)
// in a single phase, (∂h/∂T)p = cp, (∂h/∂p)T = v − T(∂v/∂T)p, (∂s/∂p)T =
// −(∂v/∂T)p and so on from the IF97 properties cp, v, αv and κT; for any
// other input pair (a, b) the sensitivities are J(p,T) · J(a,b)(p,T)⁻¹.
// On the saturation line the state is written in (T, x), and the
// saturated phases move along the line by the Clausius–Clapeyron relation
// dp/dT = Δh/(T Δv).
//
// The law is first order. Two checks say where it fails: Phase reports
// when the k = 2 interval of the distance from the saturation line (T − Ts,
// or x in a mixture) reaches the line, so that the phase itself is
// uncertain and properties jump across the interval; and Linearity
// re-evaluates a calculation at each input ± 2u and reports when the
// change departs from the linear estimate by more than a tenth (our own
// criterion, in the spirit of JCGM 101:2008 section 8, which validates the
// GUM result by Monte Carlo). The tests run that Monte Carlo (JCGM
// 101:2008, section 7) in every region.
package uncertain
