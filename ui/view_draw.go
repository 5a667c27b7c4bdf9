package ui

import (
	"image"
	"unsafe"

	figures "sectionbench/export/figure"
	"sectionbench/model"
	"sectionbench/solver"
)

// panelsKey is everything the panels view draws except its sign-convention
// key: the bodies, the ground, the window, the colours and the size. The
// bodies are keyed by identity: the engine hands back the same placed
// layout and solved configuration for every angle in free air (it turns
// the freestream, not the bodies) and new ones whenever anything they hold
// changes, in ground effect at every angle. The key holds the pointers, so
// they cannot be reused for other data while it lives.
type panelsKey struct {
	layout  *model.Layout
	bodies  *solver.Element // first of the solved configuration's elements
	nBodies int
	ground  bool
	groundY float64
	window  figures.Window
	dark    bool
	w, h    int
	dpi     float64
}

func panelsKeyOf(sc *figures.Scene, w, h int, dpi float64) panelsKey {
	k := panelsKey{layout: sc.Layout, ground: sc.Ground, groundY: sc.GroundY, window: sc.Window, dark: sc.Dark, w: w, h: h, dpi: dpi}
	if sc.Config != nil {
		k.bodies, k.nBodies = unsafe.SliceData(sc.Config.Elements), len(sc.Config.Elements)
	}
	return k
}

// panelsBase is the panels figure drawn without its key, kept while its
// key holds. Never shown itself: each frame is a copy with the key laid over.
type panelsBase struct {
	key panelsKey
	fig *figures.Figure
}

// draw renders figure fk of sc (window, colours and element already set)
// at w × h pixels, into the view's spare buffer when it has one of that
// size. The panels view redraws only its key while nothing else it draws
// has changed (an angle change in free air): a copy of the figure it kept
// with the key laid over, a fraction of a millisecond instead of the
// bodies' several.
func (p *plotCanvas) draw(fk figKind, sc *figures.Scene, w, h int, dpi float64) (*figures.Figure, error) {
	buf := p.takeBuffer(w, h)
	if fk != figPanels {
		fig, err := safeRenderFigure(buf, fk, sc, dpi)
		if err != nil {
			p.recycle(buf)
		}
		return fig, err
	}
	key := panelsKeyOf(sc, w, h, dpi)
	p.mu.Lock()
	base := p.base
	p.mu.Unlock()
	if base == nil || base.key != key {
		bare := *sc
		bare.OmitFrameKey = true
		fig, err := safeRenderFigure(image.NewRGBA(image.Rect(0, 0, w, h)), fk, &bare, dpi)
		if err != nil {
			p.recycle(buf)
			return nil, err
		}
		base = &panelsBase{key: key, fig: fig}
		p.mu.Lock()
		p.base = base
		p.mu.Unlock()
	}
	if !figures.FrameKeyFits(base.fig) {
		// No data area to lay the key in (a view shrunk to a sliver):
		// the figure drawn whole, as the other views are.
		fig, err := safeRenderFigure(buf, fk, sc, dpi)
		if err != nil {
			p.recycle(buf)
		}
		return fig, err
	}
	copy(buf.Pix, base.fig.Image.Pix)
	f := *base.fig
	f.Image = buf
	if err := recovered(func() error { figures.DrawFrameKey(&f, sc); return nil }); err != nil {
		p.recycle(buf)
		return nil, err
	}
	return &f, nil
}

// takeBuffer returns the view's spare image if it is w × h, else a new one.
func (p *plotCanvas) takeBuffer(w, h int) *image.RGBA {
	p.mu.Lock()
	b := p.spare
	p.spare = nil
	p.mu.Unlock()
	if b != nil && b.Rect.Dx() == w && b.Rect.Dy() == h {
		return b
	}
	return image.NewRGBA(image.Rect(0, 0, w, h))
}

// recycle keeps img, which nothing shows or will show, as the view's spare
// buffer for its next figure.
func (p *plotCanvas) recycle(img *image.RGBA) {
	if img == nil {
		return
	}
	p.mu.Lock()
	if p.spare == nil {
		p.spare = img
	}
	p.mu.Unlock()
}
