package perception

import "standout/perception/colour"

// Params holds every threshold of the model. Defaults are in
// DefaultParams; each says where its value comes from.
type Params struct {
	// ND is the size-dependent noticeable-difference model for colour
	// (Szafir 2018; Stone, Szafir & Setlur 2014), with viewing distance and
	// pixel density.
	ND colour.NDModel
	// Severity is the CVD severity for the re-analysis, within [0, 1].
	Severity float64

	// OrientationStepDeg is one step of orientation difference. 15° is the
	// lower edge of the "uncertain" band derived in REFERENCES §5.2 from
	// Gabor search (±15° serial, ±60° parallel).
	OrientationStepDeg float64
	// SizeStepRatio is one step of perceived-magnitude ratio. Provisional:
	// no published Weber fraction for size pop-out was found (REFERENCES
	// §5.3, §10); 1.25 is a design choice.
	SizeStepRatio float64
	// StevensArea and StevensLength convert area and length to perceived
	// magnitude, ψ = φ^a (Stevens 1975, SECONDARY: 0.7 for visual area,
	// 1.0 for length).
	StevensArea, StevensLength float64

	// Margins: a channel carries a pop-out when its contrast, in steps,
	// reaches the margin after allowing for distractor spread.
	//
	// ColourMargin is a provisional design choice: three noticeable
	// differences (Duncan 1989 says only that targets and non-targets must
	// be "sufficiently dissimilar"). LightnessMargin is two: at three, a
	// mark at half the luminance of its neighbours (#5a5a5a among #808080,
	// ΔL* ≈ 15, 2.2 noticeable differences at 10 px) blended, which no
	// reader would say of a 2:1 luminance step. Provisional too: no
	// published margin for lightness pop-out is in REFERENCES.md (the
	// calibration table in calibration_test.go holds the case).
	ColourMargin, LightnessMargin float64
	// OrientationMargin: 2 steps = 30°, "pop-out-capable with homogeneous
	// distractors" (REFERENCES §5.2, DERIVED band).
	OrientationMargin float64
	// SizeMargin: 2 steps, a perceived ratio of about 1.56 (provisional).
	SizeMargin float64
	// ShapeMargin: one class of difference. Shape is only a "probable"
	// guiding attribute (Wolfe & Horowitz 2017, SECONDARY), so it pops
	// only among homogeneous distractors.
	ShapeMargin float64

	// SmallGroupFraction and SmallGroupMin bound the size of a target
	// group: marks that share a feature value with at most
	// max(SmallGroupMin, SmallGroupFraction·n) marks, fewer than half of
	// them and fewer than the display's largest group (equal groups are
	// categories, not highlights), are candidate emphasis, judged against the heterogeneity of
	// the rest of the display; the rest are distractors. Provisional.
	SmallGroupFraction float64
	SmallGroupMin      int
	// GroupShareMax extends that to larger sets in a colour, size or
	// orientation channel (not shape, only a "probable" guiding
	// attribute), up to this share of the marks, when the rest is uniform
	// in the channel
	// (its spread under one step): a colour-defined set segregates from a
	// uniform surround at a glance whatever its share (Julesz 1981;
	// Treisman 1982; Healey, Booth & Enns 1996, all from memory), so a
	// highlighted set of 11 or 20 in 100 pops. Among several colour
	// categories, where the rest is not uniform, no category is taken for
	// a highlight; and a third keeps the halves of a two-colour display
	// from popping, where there is no rest to stand out from. The third is
	// provisional.
	GroupShareMax float64
	// GroundMargin is how far, in noticeable differences at the mark's
	// size (Szafir 2018's 50% discrimination threshold), a mark's fill or
	// outline must stand from the chart's background for the mark to be
	// seen at all: a mark the reader cannot tell from its ground cannot
	// pop out, however much it differs from the other marks. One
	// noticeable difference is the threshold itself; provisional as a
	// margin.
	GroundMargin float64
	// FlankedFactor scales the hue salience of a target whose colour lies
	// between its distractors' (not linearly separable from them), which
	// "resulted in steep search slopes" (REFERENCES §5.7, EXACT abstract
	// of the 1996 Perception follow-up to Bauer, Jolicœur & Cowan). No
	// published factor: one half is provisional.
	FlankedFactor float64
	// SeparableColours is the most distinct colours the rest may have for
	// a linearly separable colour target to be judged by its margin to
	// the rest's colour hull alone, without the heterogeneity penalty
	// (D'Zmura 1991, from memory; Bauer, Jolicœur & Cowan 1996, REFERENCES
	// §5.7: the experiments used one to a few distractor colours). Beyond
	// it, as among a categorical palette or along a colour ramp,
	// heterogeneity counts (Duncan & Humphreys 1989). Three is
	// provisional.
	SeparableColours int
	// LessFeatureFactor scales the hue salience of a target less
	// saturated than the marks around it: finding "more" of a feature
	// among "less" is easier than the reverse (Treisman & Gormican 1988,
	// from memory). No published factor: 0.8 is provisional.
	LessFeatureFactor float64
	// CombineExponent and CombineShare pool redundant cues: channels each
	// at CombineShare of the margin or more add as a Minkowski sum with
	// this exponent, so that two channels each at 0.75 of the margin pop
	// together (0.75·√2 ≈ 1.06). Guided Search sums weighted feature
	// contrasts into one priority map (Wolfe 1994, from memory; Wolfe
	// 2021, EXACT citation in REFERENCES §5.6); the exponent 2 and the
	// share 0.5 are provisional: no published pooling rule for chart
	// marks is in REFERENCES.md.
	CombineExponent, CombineShare float64
	// RivalShare is how strong, as a share of the emphasis's salience, an
	// element of another kind that pops by colour in the whole display
	// must be to compete with the emphasis (scene.go). Guided Search
	// visits items in order of priority (Wolfe 2021, REFERENCES §5.6),
	// but no published share says when a second pop-out steals the
	// first glance: one half is provisional.
	RivalShare float64
	// IsolationRatio: a point whose nearest neighbour, and the hull of
	// all the other points, lie this many times farther than the median
	// point's nearest neighbour stands apart by position, the channel that
	// encodes a point's data, and is a data extreme. Within a cloud,
	// nearest-neighbour distances beyond k times the median occur with
	// probability 2^(−k²) in a uniform random scatter (the Poisson
	// process's distribution, derived), but a cloud's corners are sparser:
	// in 300 uniform random scatters each of 30, 200 and 2,000 points, a
	// ratio of 4 found an "outlier" in 2–3% of them, 6 in 1 of the 900.
	// 6 is provisional: no published threshold for a visual outlier.
	IsolationRatio float64
	// Neighbours is how many nearest marks form the local surround
	// (Nothdurft 1993: local feature contrast). Provisional.
	Neighbours int

	// ProximityRatio is the single-linkage threshold as a multiple of the
	// median nearest-neighbour distance: an engineering convention, not
	// published (REFERENCES §7.2, after Kubovy et al. 1998's ratio law).
	ProximityRatio float64
	// ProximityGap is how many times wider than the widest link within
	// them the gaps between proximity groups must be for a reader to see
	// the groups (grouping.go: proximityGroups): an engineering convention
	// after the ratio law (Kubovy et al. 1998), not a published threshold.
	// Provisional.
	ProximityGap float64
	// ConnectTolerancePx is how far a mark centre may sit from a line and
	// still count as on it, beyond half the line's stroke width.
	ConnectTolerancePx float64
	// ConflictARI and AgreeARI classify the Adjusted Rand Index between two
	// cue partitions. Provisional.
	ConflictARI, AgreeARI float64

	// EfficientSlope and SerialSlope are search-slope ranges in ms per
	// item: efficient search "~10 ms/item or less", serial "often around
	// 25 ms/item or longer" (REFERENCES §5.1); 20–50 ms/item for
	// target-present inefficient search (REFERENCES §5.6, DERIVED).
	EfficientSlope, SerialSlope [2]float64
	// LogSearchMs is the steepness D, in ms per unit of ln(set size), of
	// guided search for a target at the pop-out margin: added search time
	// is 0 to D·ln(N)/salience. Efficient search "is best characterized
	// by logarithmic curves", their steepness "determined by the
	// similarity between target and distractor items" (Wang, Buetti &
	// Lleras 2017, after Buetti et al. 2016; REFERENCES §5.6, EXACT); so
	// a strongly salient target's curve is nearly flat, as pop-out's is
	// ("near … 0 ms/item", Wolfe 2021). No published D was found: 88 ms
	// makes the curve agree with the 10 ms per mark of EfficientSlope at
	// 30 marks (88·ln 30 ≈ 300 ms), and is provisional. Serial search
	// stays linear (SerialSlope × N).
	LogSearchMs float64

	// FindingsOnly computes only what the verdicts under normal vision and
	// the findings need: the CVD re-analysis of the emphasised marks
	// (declared or inferred) alone, the other marks' CVD verdicts being
	// left empty, and no row or column partitions, which no finding
	// compares. The extension's overlay uses it; reports that list every
	// mark's CVD verdicts and every partition do not.
	FindingsOnly bool

	// Kept, when set, is what the last analysis given it kept for this
	// one (Kept): no threshold, and nil in DefaultParams. The extension's
	// core keeps one for the checks of a page again.
	Kept *Kept

	// MaxHues is the number of categorical colours above which categories
	// get hard to tell apart: Ware's "easy to select six distinct colors"
	// (REFERENCES §8, EXACT publisher summary).
	MaxHues int
}

// DefaultParams are the documented defaults.
var DefaultParams = Params{
	ND:                 colour.DefaultND,
	Severity:           1,
	OrientationStepDeg: 15,
	SizeStepRatio:      1.25,
	StevensArea:        0.7,
	StevensLength:      1.0,
	ColourMargin:       3,
	LightnessMargin:    2,
	OrientationMargin:  2,
	SizeMargin:         2,
	ShapeMargin:        1,
	SmallGroupFraction: 0.1,
	GroupShareMax:      1.0 / 3,
	SmallGroupMin:      3,
	GroundMargin:       1,
	FlankedFactor:      0.5,
	CombineExponent:    2,
	CombineShare:       0.5,
	LessFeatureFactor:  0.8,
	SeparableColours:   3,
	RivalShare:         0.5,
	IsolationRatio:     6,
	Neighbours:         8,
	ProximityRatio:     2,
	ProximityGap:       1.5,
	ConnectTolerancePx: 1.5,
	ConflictARI:        0.2,
	AgreeARI:           0.8,
	EfficientSlope:     [2]float64{0, 10},
	SerialSlope:        [2]float64{20, 50},
	LogSearchMs:        88,
	MaxHues:            6,
}
