package solver

import "slices"

// speedCache keeps Ue0 + D m for the mass defects it was last asked for.
// A Newton iteration asks for the edge velocities of the same mass
// defects several times (its step, the step's under-relaxation, transition
// and the stagnation points after it, the next step), each a product with
// the n × n matrix D; on the two-element polar these products were a
// sixth of the time. The cached speeds are the same numbers to the last
// bit (the same operations in the same order). It belongs to the state
// being iterated (newtonWork), which one goroutine owns; ue itself, which
// other solutions' warm starts call on a shared state, stays uncached.
type speedCache struct {
	d, ue0 []float64 // the sensitivities the speeds were made with
	m, v   []float64 // the mass defects and Ue0 + D m
}

// sameSlice reports whether a and b are the same slice (same array, same
// length).
func sameSlice(a, b []float64) bool {
	return len(a) == len(b) && (len(a) == 0 || &a[0] == &b[0])
}

// ueIterated is ue for the state being iterated: the same speeds, from
// speedCache when the mass defects and sensitivities have not changed.
// The slice returned is the caller's.
func (cs *coupledState) ueIterated() []float64 {
	n := len(cs.st)
	c := &cs.work.speeds
	if !sameSlice(c.d, cs.d) || !sameSlice(c.ue0, cs.ue0) || !slices.Equal(c.m, cs.m) {
		c.d, c.ue0 = cs.d, cs.ue0
		c.m = append(c.m[:0], cs.m...)
		c.v = slices.Grow(c.v[:0], n)[:n]
		rowProducts(cs.d, n, cs.m, cs.ue0, c.v)
	}
	out := make([]float64, n)
	for i, v := range c.v {
		if cs.ueMarch != nil {
			v = (1-cs.lam)*cs.ueMarch[i] + cs.lam*v
		}
		out[i] = v
	}
	return out
}

// rowProducts sets out[i] = init[i] + Σ_j a[i n + j] x[j] (init nil: 0)
// for the n × n row-major matrix a, each row summed from its first column
// to its last (the order of the plain loop, so the numbers are the same
// to the last bit). Four rows are summed at once: a single row's sum is
// one chain of dependent additions, which keeps the processor waiting.
// It runs on one core: a product takes a few tens of microseconds, the
// order of what starting and joining workers costs.
func rowProducts(a []float64, n int, x, init, out []float64) {
	x = x[:n]
	i := 0
	for ; i+4 <= n; i += 4 {
		var v0, v1, v2, v3 float64
		if init != nil {
			v0, v1, v2, v3 = init[i], init[i+1], init[i+2], init[i+3]
		}
		r0 := a[i*n : i*n+n]
		r1 := a[(i+1)*n : (i+1)*n+n]
		r2 := a[(i+2)*n : (i+2)*n+n]
		r3 := a[(i+3)*n : (i+3)*n+n]
		r0, r1, r2, r3 = r0[:len(x)], r1[:len(x)], r2[:len(x)], r3[:len(x)]
		for j, xj := range x {
			v0 += r0[j] * xj
			v1 += r1[j] * xj
			v2 += r2[j] * xj
			v3 += r3[j] * xj
		}
		out[i], out[i+1], out[i+2], out[i+3] = v0, v1, v2, v3
	}
	for ; i < n; i++ {
		var v float64
		if init != nil {
			v = init[i]
		}
		r := a[i*n : i*n+n]
		r = r[:len(x)]
		for j, xj := range x {
			v += r[j] * xj
		}
		out[i] = v
	}
}
