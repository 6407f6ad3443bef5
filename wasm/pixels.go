package main

import (
	"strconv"

	"standout/internal/jsonio"
	"standout/internal/report"
	"standout/perception"
	"standout/perception/saliency"
)

// MaxPixels bounds a chart drawn as pixels that the core judges: 4 Mpx
// (2,000 × 2,000).
const MaxPixels = 4 << 20

// Saliency judges a chart drawn as pixels: rgba holds w×h pixels, 8 bits a
// channel, row by row, as a canvas's ImageData has them. The answer is a
// JSON object keyed by vision type ("normal", then each CVD type at
// severity), each the most salient regions, strongest first, with their
// boxes in the image's pixels: {"ok":true,"regions":{"normal":[{"box":
// [x,y,w,h],"salience":1},…],…}}.
func Saliency(rgba []byte, w, h int, severity float64) []byte {
	if w <= 0 || h <= 0 || w*h > MaxPixels || len(rgba) != 4*w*h {
		return errorResponse("saliency: want w×h RGBA pixels, at most " + strconv.Itoa(MaxPixels) + " of them")
	}
	if !(severity >= 0 && severity <= 1) {
		severity = perception.DefaultParams.Severity
	}
	perVision := saliency.PerVision(saliency.FromRGBA(rgba, w, h), perception.Visions, severity, saliency.Reported)
	b := []byte(`{"ok":true,"regions":{`)
	for k, v := range perception.Visions {
		if k > 0 {
			b = append(b, ',')
		}
		b = strconv.AppendQuote(b, v.String())
		b = append(b, ":["...)
		for j, r := range perVision[k] {
			if j > 0 {
				b = append(b, ',')
			}
			b = append(b, `{"box":[`...)
			for q, x := range r.Box {
				if q > 0 {
					b = append(b, ',')
				}
				b = strconv.AppendFloat(b, float64(int64(x*100+0.5))/100, 'f', -1, 64)
			}
			b = append(b, `],"salience":`...)
			b = strconv.AppendFloat(b, float64(int64(r.Salience*100+0.5))/100, 'f', -1, 64)
			b = append(b, '}')
		}
		b = append(b, ']')
	}
	return append(b, "}}"...)
}

// parsePixels reads the options' pixels: [{name, regions: {vision:
// [{box, salience}, …], …}}, …].
func parsePixels(d *jsonio.Scanner) ([]PixelJudgement, error) {
	if d.Null() {
		return nil, nil
	}
	out := []PixelJudgement{}
	err := d.Array(func() error {
		p := PixelJudgement{Regions: map[string][]report.Region{}}
		err := d.Object(func(key string) error {
			switch key {
			case "name":
				var err error
				p.Name, err = d.Text()
				return err
			case "regions":
				return d.Object(func(vision string) error {
					rs, err := parseRegions(d)
					p.Regions[vision] = rs
					return err
				})
			}
			return d.Skip()
		})
		out = append(out, p)
		return err
	})
	return out, err
}

func parseRegions(d *jsonio.Scanner) ([]report.Region, error) {
	rs := []report.Region{}
	err := d.Array(func() error {
		var r report.Region
		err := d.Object(func(key string) error {
			switch key {
			case "box":
				b, err := d.Numbers(nil)
				if err == nil && len(b) != 4 {
					err = d.Error("a region's box has " + strconv.Itoa(len(b)) + " numbers, not 4")
				}
				if err == nil {
					r.Box = [4]float64(b)
				}
				return err
			case "salience":
				var err error
				r.Salience, err = d.Number()
				return err
			}
			return d.Skip()
		})
		rs = append(rs, r)
		return err
	})
	return rs, err
}

// parsePick reads the options' pick: {name, x, y}, or null.
func parsePick(d *jsonio.Scanner) (*PixelPick, error) {
	if d.Null() {
		return nil, nil
	}
	p := &PixelPick{}
	err := d.Object(func(key string) error {
		var err error
		switch key {
		case "name":
			p.Name, err = d.Text()
		case "x":
			p.X, err = d.Number()
		case "y":
			p.Y, err = d.Number()
		default:
			err = d.Skip()
		}
		return err
	})
	return p, err
}
