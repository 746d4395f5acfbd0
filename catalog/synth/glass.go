package synth

import (
	"fmt"
	"sync"

	"cardinal/optics"
)

// glassInfo is a medium with its d-line index and Abbe number.
type glassInfo struct {
	medium optics.Medium
	nd, vd float64
}

var (
	glassMu    sync.Mutex
	glassCache = map[string]glassInfo{}
	builtins   = optics.BuiltinGlasses()
)

// lookupGlass resolves a glass name or six-digit code through the built-in
// glass table, once per name.
func lookupGlass(name string) (glassInfo, error) {
	glassMu.Lock()
	defer glassMu.Unlock()
	if g, ok := glassCache[name]; ok {
		return g, nil
	}
	m, err := builtins.Lookup(name)
	if err != nil {
		return glassInfo{}, err
	}
	nd, nf, nc := m.Index(optics.LineD), m.Index(optics.LineF), m.Index(optics.LineC)
	if !(nd > 1) || !(nf > nc) {
		return glassInfo{}, fmt.Errorf("glass %q: not a dispersive glass (nd %g)", name, nd)
	}
	// Abbe number Vd = (nd - 1)/(nF - nC) (definition; ISO 7944).
	g := glassInfo{medium: m, nd: nd, vd: (nd - 1) / (nf - nc)}
	glassCache[name] = g
	return g, nil
}
