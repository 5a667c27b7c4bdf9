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
		for i := range n {
			v := cs.ue0[i]
			d := cs.d[i*n : (i+1)*n]
			d = d[:len(cs.m)]
			for j, mj := range cs.m {
				v += d[j] * mj
			}
			c.v[i] = v
		}
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
