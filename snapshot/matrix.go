package snapshot

// Matrix is a 2-D affine transform (a b c d e f), mapping (x, y) to
// (a·x + c·y + e, b·x + d·y + f), as in SVG 1.1 §7.4.
type Matrix [6]float64

// IdentityMatrix is the identity transform.
var IdentityMatrix = Matrix{1, 0, 0, 1, 0, 0}

// Mul returns m·n: n is applied first, then m.
func (m Matrix) Mul(n Matrix) Matrix {
	return Matrix{
		m[0]*n[0] + m[2]*n[1],
		m[1]*n[0] + m[3]*n[1],
		m[0]*n[2] + m[2]*n[3],
		m[1]*n[2] + m[3]*n[3],
		m[0]*n[4] + m[2]*n[5] + m[4],
		m[1]*n[4] + m[3]*n[5] + m[5],
	}
}

// Apply maps a point.
func (m Matrix) Apply(x, y float64) (float64, float64) {
	return m[0]*x + m[2]*y + m[4], m[1]*x + m[3]*y + m[5]
}

// Det is the determinant, the factor by which areas scale.
func (m Matrix) Det() float64 { return m[0]*m[3] - m[1]*m[2] }
