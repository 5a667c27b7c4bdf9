package solver

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"
)

// The closed form of influence.go against direct quadrature of the point
// vortex kernel (Katz & Plotkin, Low-Speed Aerodynamics, 2nd ed., sec.
// 10.3.2, integrand of the linear-strength vortex element).
func TestLinearVortexAgainstQuadrature(t *testing.T) {
	g, err := newGeometry(circleConfig(12))
	if err != nil {
		t.Fatal(err)
	}
	rng := rand.New(rand.NewPCG(1, 2))
	for j := range g.panels {
		p := g.panels[j]
		for range 20 {
			// Points within a few panel lengths, but not on the panel.
			px := p.mx + (rng.Float64()*2-1)*2*p.l
			py := p.my + (rng.Float64()*2-1)*2*p.l
			if math.Abs((px-p.x1)*p.nx+(py-p.y1)*p.ny) < 0.05*p.l {
				continue
			}
			ua, va, ub, vb := panelInfluence(&g.panels[j], px, py)
			// Quadrature of u, v for γ = 1 − ξ/L (node a) and ξ/L (node b).
			kern := func(xi float64, wa bool) (u, v float64) {
				x, y := p.x1+xi*p.tx, p.y1+xi*p.ty
				dx, dy := px-x, py-y
				r2 := dx*dx + dy*dy
				w := xi / p.l
				if wa {
					w = 1 - xi/p.l
				}
				// Clockwise vortex: u = Γ dy/(2π r²), v = −Γ dx/(2π r²).
				return w * dy / (2 * math.Pi * r2), -w * dx / (2 * math.Pi * r2)
			}
			const nq = 200
			qua := quad.Fixed(func(x float64) float64 { u, _ := kern(x, true); return u }, 0, p.l, nq, nil, 0)
			qva := quad.Fixed(func(x float64) float64 { _, v := kern(x, true); return v }, 0, p.l, nq, nil, 0)
			qub := quad.Fixed(func(x float64) float64 { u, _ := kern(x, false); return u }, 0, p.l, nq, nil, 0)
			qvb := quad.Fixed(func(x float64) float64 { _, v := kern(x, false); return v }, 0, p.l, nq, nil, 0)
			for _, c := range []struct {
				name      string
				got, want float64
			}{{"ua", ua, qua}, {"va", va, qva}, {"ub", ub, qub}, {"vb", vb, qvb}} {
				if math.Abs(c.got-c.want) > 1e-10 {
					t.Errorf("panel %d at (%.4g, %.4g): %s = %.12g, quadrature %.12g", j, px, py, c.name, c.got, c.want)
				}
			}
		}
	}
}

// Approaching the midpoint from outside, the panel's tangential velocity
// tends to −γ/2 and its normal velocity to the self-influence limit used
// in the matrix (λ = 0, Δθ = −π): a vortex sheet's tangential jump is γ
// (Katz & Plotkin sec. 10.3.2).
func TestSelfInfluenceLimit(t *testing.T) {
	g, err := newGeometry(circleConfig(16))
	if err != nil {
		t.Fatal(err)
	}
	j := 5
	p := g.panels[j]
	for _, side := range []struct {
		name string
		sign float64 // along the outward normal
		ut   float64 // tangential coefficient sum for γa = γb = 1
	}{{"outside", 1, -0.5}, {"inside", -1, 0.5}} {
		eps := 1e-9 * p.l
		px, py := p.mx+side.sign*eps*p.nx, p.my+side.sign*eps*p.ny
		ua, va, ub, vb := panelInfluence(&g.panels[j], px, py)
		ut := (ua+ub)*p.tx + (va+vb)*p.ty
		if math.Abs(ut-side.ut) > 1e-8 {
			t.Errorf("%s: tangential velocity %g, want %g", side.name, ut, side.ut)
		}
		// Exact limit: local v' coefficients −1/(2π) and +1/(2π).
		lua, lva, lub, lvb := linearVortex(p.l/2, 0, 1/p.l, -math.Pi, 0)
		na := ua*p.nx + va*p.ny
		nb := ub*p.nx + vb*p.ny
		// Panel-frame y' is −n, so the outward normal component is −v'.
		if math.Abs(na-(-lva)) > 1e-8 || math.Abs(nb-(-lvb)) > 1e-8 {
			t.Errorf("%s: normal coefficients %g %g, limit %g %g", side.name, na, nb, -lva, -lvb)
		}
		_, _ = lua, lub
	}
}

// A point exactly on a node or on the panel gives finite values.
func TestInfluenceFiniteOnPanel(t *testing.T) {
	g, err := newGeometry(circleConfig(16))
	if err != nil {
		t.Fatal(err)
	}
	p := g.panels[3]
	for _, pt := range [][2]float64{{p.x1, p.y1}, {p.x2, p.y2}, {p.mx, p.my}, {p.x1 + 0.3*(p.x2-p.x1), p.y1 + 0.3*(p.y2-p.y1)}} {
		ua, va, ub, vb := panelInfluence(&g.panels[3], pt[0], pt[1])
		for _, v := range []float64{ua, va, ub, vb} {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				t.Errorf("at (%g, %g): non-finite coefficient %v", pt[0], pt[1], []float64{ua, va, ub, vb})
			}
		}
	}
}

// The constant-strength source panel of influence.go against direct
// quadrature of the point-source kernel u = σ (x − ξ)/(2π r²),
// v = σ y/(2π r²) (Katz & Plotkin, Low-Speed Aerodynamics, 2nd ed., sec.
// 10.2.1), and its normal velocity ±σ/2 on the two faces at the midpoint.
func TestConstantSourceAgainstQuadrature(t *testing.T) {
	g, err := newGeometry(circleConfig(12))
	if err != nil {
		t.Fatal(err)
	}
	rng := rand.New(rand.NewPCG(13, 14))
	for j := range g.panels {
		p := &g.panels[j]
		for range 20 {
			px := p.mx + (rng.Float64()*2-1)*2*p.l
			py := p.my + (rng.Float64()*2-1)*2*p.l
			if math.Abs((px-p.x1)*p.nx+(py-p.y1)*p.ny) < 0.05*p.l {
				continue
			}
			u, v := sourceInfluence(p, px, py)
			ker := func(xi float64) (float64, float64) {
				dx, dy := px-(p.x1+xi*p.tx), py-(p.y1+xi*p.ty)
				r2 := dx*dx + dy*dy
				return dx / (2 * math.Pi * r2), dy / (2 * math.Pi * r2)
			}
			const nq = 200
			qu := quad.Fixed(func(x float64) float64 { u, _ := ker(x); return u }, 0, p.l, nq, nil, 0)
			qv := quad.Fixed(func(x float64) float64 { _, v := ker(x); return v }, 0, p.l, nq, nil, 0)
			if math.Abs(u-qu) > 1e-10 || math.Abs(v-qv) > 1e-10 {
				t.Errorf("panel %d at (%.4g, %.4g): (%.12g, %.12g), quadrature (%.12g, %.12g)", j, px, py, u, v, qu, qv)
			}
		}
		for _, side := range []struct {
			name string
			sign float64 // along the outward normal
		}{{"outside", 1}, {"inside", -1}} {
			eps := 1e-9 * p.l
			u, v := sourceInfluence(p, p.mx+side.sign*eps*p.nx, p.my+side.sign*eps*p.ny)
			if vn := u*p.nx + v*p.ny; math.Abs(vn-side.sign/2) > 1e-8 {
				t.Errorf("panel %d %s: normal velocity %g per unit σ, want %g", j, side.name, vn, side.sign/2)
			}
		}
	}
}

// subtended's series (far panels) and closed forms (near ones) against
// math.Atan2 and the logarithm of the distance ratio, over panels of random
// direction and points from 10⁻³ to 10³ panel lengths away: agreement to
// rounding (1e-15, absolute and relative), with both paths exercised.
func TestSubtendedSeries(t *testing.T) {
	rng := rand.New(rand.NewPCG(15, 16))
	series, closed := 0, 0
	for range 20000 {
		l := math.Exp(rng.Float64()*6 - 5)
		phi := 2 * math.Pi * rng.Float64()
		tx, ty := math.Cos(phi), math.Sin(phi)
		x1, y1 := rng.Float64(), rng.Float64()
		x2, y2 := x1+l*tx, y1+l*ty
		d := l * math.Exp(rng.Float64()*14-7)
		psi := 2 * math.Pi * rng.Float64()
		px, py := x1+0.5*l*tx+d*math.Cos(psi), y1+0.5*l*ty+d*math.Sin(psi)
		r1x, r1y, r2x, r2y := px-x1, py-y1, px-x2, py-y2
		s1, s2 := r1x*r1x+r1y*r1y, r2x*r2x+r2y*r2y
		x := r1x*tx + r1y*ty
		dth, lam := subtended(r1x, r1y, r2x, r2y, s1, s2, x, l, 0)
		wantT := math.Atan2(r1x*r2y-r1y*r2x, r1x*r2x+r1y*r2y)
		wantL := 0.5 * math.Log(s1/s2)
		if tol := 1e-15 * math.Max(1, math.Abs(wantT)); math.Abs(dth-wantT) > tol {
			t.Fatalf("l %g, d/l %g: Δθ %.17g, atan2 %.17g", l, d/l, dth, wantT)
		}
		if tol := 1e-15 * math.Max(1, math.Abs(wantL)); math.Abs(lam-wantL) > tol {
			t.Fatalf("l %g, d/l %g: λ %.17g, log %.17g", l, d/l, lam, wantL)
		}
		dot := r1x*r2x + r1y*r2y
		if dot > 0 && math.Abs((r1x*r2y-r1y*r2x)/dot) < seriesMax && math.Abs(l*(2*x-l)/(s1+s2)) < seriesMax {
			series++
		} else {
			closed++
		}
	}
	if series < 1000 || closed < 1000 {
		t.Errorf("paths taken: %d series, %d closed form; want both exercised", series, closed)
	}
}
