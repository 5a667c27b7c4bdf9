package liftingline

import (
	"fmt"
	"math"
)

// Planform is a straight, unswept, symmetric wing: its span and its chord
// along the span. The zero value is not usable; build one with
// Rectangular, Tapered or Elliptic.
type Planform struct {
	SpanM float64
	kind  planformKind
	root  float64 // chord at the centre, m
	tip   float64 // chord at the tips (Tapered), m
}

type planformKind int

const (
	rectangular planformKind = iota + 1
	tapered
	elliptic
)

// Rectangular is a wing of constant chord.
func Rectangular(spanM, chordM float64) Planform {
	checkLengths(spanM, chordM)
	return Planform{SpanM: spanM, kind: rectangular, root: chordM, tip: chordM}
}

// Tapered is a wing whose chord falls linearly from rootM at the centre to
// tipM at the tips.
func Tapered(spanM, rootM, tipM float64) Planform {
	checkLengths(spanM, rootM)
	if !(tipM > 0) {
		panic(fmt.Sprintf("liftingline: tip chord %g is not positive", tipM))
	}
	return Planform{SpanM: spanM, kind: tapered, root: rootM, tip: tipM}
}

// Elliptic is a wing whose chord is rootM √(1 − (2y/b)²).
func Elliptic(spanM, rootM float64) Planform {
	checkLengths(spanM, rootM)
	return Planform{SpanM: spanM, kind: elliptic, root: rootM}
}

func checkLengths(span, chord float64) {
	if !(span > 0) || !(chord > 0) || math.IsInf(span, 0) || math.IsInf(chord, 0) {
		panic(fmt.Sprintf("liftingline: span %g and chord %g must be positive and finite", span, chord))
	}
}

// Chord returns the chord in metres at eta = 2|y|/b in [0, 1].
func (p Planform) Chord(eta float64) float64 {
	eta = math.Abs(eta)
	switch p.kind {
	case rectangular:
		return p.root
	case tapered:
		return p.root + (p.tip-p.root)*eta
	case elliptic:
		return p.root * math.Sqrt(math.Max(0, 1-eta*eta))
	}
	panic("liftingline: planform not built by Rectangular, Tapered or Elliptic")
}

// Area returns the planform area in m².
func (p Planform) Area() float64 {
	switch p.kind {
	case rectangular, tapered:
		return p.SpanM * (p.root + p.tip) / 2
	case elliptic:
		return math.Pi * p.SpanM * p.root / 4
	}
	panic("liftingline: planform not built by Rectangular, Tapered or Elliptic")
}

// AspectRatio returns b²/S.
func (p Planform) AspectRatio() float64 { return p.SpanM * p.SpanM / p.Area() }
