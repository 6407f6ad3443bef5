package report

// The report as JSON, written by hand: the WebAssembly core must not link
// encoding/json, whose reflection adds about 0.6 MB to the module and its
// compile time to every first check. The output is byte for byte what
// encoding/json writes with HTML escaping off (TestAppendJSONMatches-
// EncodingJSON holds it to that): fields in declaration order, omitempty
// as the tags say, nil slices and maps as null, map keys sorted.

import "standout/internal/jsonio"

// AppendJSON writes the report as JSON.
func AppendJSON(b []byte, r *Report) []byte {
	b = append(b, '{')
	if len(r.Errors) > 0 {
		b = append(b, `"errors":`...)
		b = appendStrings(b, r.Errors)
		b = append(b, ',')
	}
	b = append(b, `"schema":`...)
	b = jsonio.AppendString(b, r.Schema)
	b = append(b, `,"version":`...)
	b = jsonio.AppendNumber(b, float64(r.Version))
	b = append(b, `,"minor":`...)
	b = jsonio.AppendNumber(b, float64(r.Minor))
	b = append(b, `,"pages":`...)
	b = appendList(b, r.Pages, appendPage)
	if len(r.ViewChanges) > 0 {
		b = append(b, `,"viewChanges":`...)
		b = appendStrings(b, r.ViewChanges)
	}
	b = append(b, `,"caution":`...)
	b = jsonio.AppendString(b, r.Caution)
	return append(b, '}')
}

// appendList writes a slice with one writer per element; nil is null.
func appendList[T any](b []byte, v []T, each func([]byte, *T) []byte) []byte {
	if v == nil {
		return append(b, "null"...)
	}
	b = append(b, '[')
	for i := range v {
		if i > 0 {
			b = append(b, ',')
		}
		b = each(b, &v[i])
	}
	return append(b, ']')
}

func appendStrings(b []byte, v []string) []byte {
	return appendList(b, v, func(b []byte, s *string) []byte { return jsonio.AppendString(b, *s) })
}

func appendNumbers(b []byte, v []float64) []byte {
	return appendList(b, v, func(b []byte, f *float64) []byte { return jsonio.AppendNumber(b, *f) })
}

func appendBox(b []byte, v [4]float64) []byte { return appendNumbers(b, v[:]) }

func appendBool(b []byte, v bool) []byte {
	if v {
		return append(b, "true"...)
	}
	return append(b, "false"...)
}

func appendPage(b []byte, p *Page) []byte {
	b = append(b, `{"source":`...)
	b = jsonio.AppendString(b, p.Source)
	if p.View != nil {
		b = append(b, `,"view":{`...)
		comma := false
		if p.View.Width != 0 {
			b = append(b, `"width":`...)
			b = jsonio.AppendNumber(b, float64(p.View.Width))
			comma = true
		}
		if p.View.Scheme != "" {
			if comma {
				b = append(b, ',')
			}
			b = append(b, `"scheme":`...)
			b = jsonio.AppendString(b, p.View.Scheme)
		}
		b = append(b, '}')
	}
	b = append(b, `,"charts":`...)
	b = appendList(b, p.Charts, appendChart)
	b = append(b, `,"problems":`...)
	b = appendStrings(b, p.Problems)
	if len(p.Unchecked) > 0 {
		b = append(b, `,"unchecked":`...)
		b = appendList(b, p.Unchecked, appendUnchecked)
	}
	if len(p.Findings) > 0 {
		b = append(b, `,"findings":`...)
		b = appendList(b, p.Findings, appendFinding)
	}
	return append(b, '}')
}

func appendChart(b []byte, c *Chart) []byte {
	b = append(b, `{"path":`...)
	b = jsonio.AppendString(b, c.Path)
	b = append(b, `,"source":`...)
	b = jsonio.AppendString(b, c.Source)
	b = appendOptString(b, "title", c.Title)
	b = appendOptString(b, "anchor", c.Anchor)
	b = append(b, `,"isChart":`...)
	b = appendBool(b, c.IsChart)
	b = appendOptString(b, "reason", c.Reason)
	b = append(b, `,"box":`...)
	b = appendBox(b, c.Box)
	b = appendOptString(b, "background", c.Background)
	b = append(b, `,"marks":`...)
	b = appendList(b, c.Marks, appendMark)
	b = append(b, `,"legend":`...)
	b = appendList(b, c.Legend, appendMark)
	b = append(b, `,"furniture":`...)
	b = jsonio.AppendMap(b, c.Furniture, func(b []byte, n int) []byte { return jsonio.AppendNumber(b, float64(n)) })
	b = append(b, `,"problems":`...)
	b = appendStrings(b, c.Problems)
	b = append(b, `,"findings":`...)
	b = appendList(b, c.Findings, appendFinding)
	if c.Groups != nil {
		b = append(b, `,"groups":{"partitions":`...)
		b = appendList(b, c.Groups.Partitions, func(b []byte, p *Partition) []byte {
			b = append(b, `{"cue":`...)
			b = jsonio.AppendString(b, p.Cue)
			b = append(b, `,"groups":`...)
			b = jsonio.AppendNumber(b, float64(p.Groups))
			return append(b, '}')
		})
		b = append(b, `,"agreement":`...)
		b = appendList(b, c.Groups.Agreement, func(b []byte, a *Agreement) []byte {
			b = append(b, `{"a":`...)
			b = jsonio.AppendString(b, a.A)
			b = append(b, `,"b":`...)
			b = jsonio.AppendString(b, a.B)
			b = append(b, `,"ari":`...)
			b = jsonio.AppendNumber(b, a.ARI)
			b = append(b, `,"relation":`...)
			b = jsonio.AppendString(b, a.Relation)
			return append(b, '}')
		})
		b = append(b, '}')
	}
	if len(c.Extremes) > 0 {
		b = append(b, `,"extremes":`...)
		b = appendStrings(b, c.Extremes)
	}
	if c.Emphasis != nil {
		b = append(b, `,"emphasis":{"marks":`...)
		b = appendStrings(b, c.Emphasis.Marks)
		b = append(b, `,"inferred":`...)
		b = appendBool(b, c.Emphasis.Inferred)
		b = append(b, `,"holds":`...)
		b = jsonio.AppendMap(b, c.Emphasis.Holds, appendBool)
		if c.Emphasis.Box != nil {
			b = append(b, `,"box":`...)
			b = appendBox(b, *c.Emphasis.Box)
		}
		b = append(b, '}')
	}
	return append(appendRegions(b, c.Regions, c.CVD), '}')
}

// appendRegions writes the fields of the salient regions of a chart drawn
// as pixels and of their CVD re-runs, when there are any.
func appendRegions(b []byte, regions []Region, cvd map[string][]Region) []byte {
	if len(regions) > 0 {
		b = append(b, `,"regions":`...)
		b = appendList(b, regions, appendRegion)
	}
	if len(cvd) > 0 {
		b = append(b, `,"cvd":`...)
		b = jsonio.AppendMap(b, cvd, func(b []byte, rs []Region) []byte { return appendList(b, rs, appendRegion) })
	}
	return b
}

// appendOptString writes ,"key":"value" unless the value is empty.
func appendOptString(b []byte, key, v string) []byte {
	if v == "" {
		return b
	}
	b = append(b, ',', '"')
	b = append(b, key...)
	b = append(b, '"', ':')
	return jsonio.AppendString(b, v)
}

func appendStringPtr(b []byte, v *string) []byte {
	if v == nil {
		return append(b, "null"...)
	}
	return jsonio.AppendString(b, *v)
}

func appendMark(b []byte, m *Mark) []byte {
	b = append(b, `{"id":`...)
	b = jsonio.AppendString(b, m.ID)
	b = append(b, `,"kind":`...)
	b = jsonio.AppendString(b, m.Kind)
	b = append(b, `,"shape":`...)
	b = jsonio.AppendString(b, m.Shape)
	b = append(b, `,"fill":`...)
	b = appendStringPtr(b, m.Fill)
	b = append(b, `,"stroke":`...)
	b = appendStringPtr(b, m.Stroke)
	if len(m.FillStops) > 0 {
		b = append(b, `,"fillStops":`...)
		b = appendStrings(b, m.FillStops)
	}
	for _, f := range []struct {
		key string
		v   float64
	}{{`,"opacity":`, m.Opacity}, {`,"fillOpacity":`, m.FillOpacity}} {
		b = append(b, f.key...)
		b = jsonio.AppendNumber(b, f.v)
	}
	b = append(b, `,"bbox":`...)
	b = appendBox(b, m.BBox)
	for _, f := range []struct {
		key string
		v   float64
	}{{`,"area":`, m.Area}, {`,"angle":`, m.Angle}, {`,"size":`, m.Size}} {
		b = append(b, f.key...)
		b = jsonio.AppendNumber(b, f.v)
	}
	b = appendOptString(b, "text", m.Text)
	if len(m.Points) > 0 {
		b = append(b, `,"points":`...)
		b = appendList(b, m.Points, func(b []byte, p *[2]float64) []byte { return appendNumbers(b, p[:]) })
	}
	if m.Weight != 0 {
		b = append(b, `,"weight":`...)
		b = jsonio.AppendNumber(b, m.Weight)
	}
	b = appendOptString(b, "label", m.Label)
	b = appendOptString(b, "verdict", m.Verdict)
	if len(m.Channels) > 0 {
		b = append(b, `,"channels":`...)
		b = appendStrings(b, m.Channels)
	}
	if len(m.SearchSlope) > 0 {
		b = append(b, `,"searchSlopeMsPerMark":`...)
		b = appendNumbers(b, m.SearchSlope)
	}
	if len(m.SearchMs) > 0 {
		b = append(b, `,"searchMsEstimate":`...)
		b = appendNumbers(b, m.SearchMs)
	}
	if m.CVD != nil {
		b = append(b, `,"cvd":`...)
		b = appendCVD(b, m.CVD)
	}
	return append(b, '}')
}

func appendCVD(b []byte, c *CVDResults) []byte {
	for _, v := range []struct {
		key string
		r   *Result
	}{{`{"protan":`, &c.Protan}, {`,"deutan":`, &c.Deutan}, {`,"tritan":`, &c.Tritan}, {`,"achromat":`, &c.Achromat}} {
		b = append(b, v.key...)
		b = append(b, `{"verdict":`...)
		b = jsonio.AppendString(b, v.r.Verdict)
		b = append(b, `,"channels":`...)
		b = appendStrings(b, v.r.Channels)
		if len(v.r.SlopeMs) > 0 {
			b = append(b, `,"searchSlopeMsPerMark":`...)
			b = appendNumbers(b, v.r.SlopeMs)
		}
		b = append(b, '}')
	}
	return append(b, '}')
}

func appendFinding(b []byte, f *Finding) []byte {
	b = append(b, `{"id":`...)
	b = jsonio.AppendString(b, f.ID)
	b = append(b, `,"severity":`...)
	b = jsonio.AppendString(b, f.Severity)
	b = append(b, `,"marks":`...)
	b = appendStrings(b, f.Marks)
	b = append(b, `,"message":`...)
	b = jsonio.AppendString(b, f.Message)
	b = appendOptString(b, "evidence", f.Evidence)
	b = append(b, `,"source":`...)
	b = jsonio.AppendString(b, f.Source)
	if x := f.Fix; x != nil {
		b = append(b, `,"fix":{"kind":`...)
		b = jsonio.AppendString(b, x.Kind)
		b = append(b, `,"css":`...)
		b = jsonio.AppendString(b, x.CSS)
		b = appendOptString(b, "rule", x.Rule)
		b = append(b, `,"marginND":`...)
		b = jsonio.AppendMap(b, x.Margin, jsonio.AppendNumber)
		b = append(b, `,"verified":`...)
		b = appendBool(b, x.Verified)
		b = appendOptString(b, "alternative", x.Alternative)
		b = append(b, '}')
	}
	return append(b, '}')
}

func appendRegion(b []byte, r *Region) []byte {
	b = append(b, `{"box":`...)
	b = appendBox(b, r.Box)
	b = append(b, `,"salience":`...)
	b = jsonio.AppendNumber(b, r.Salience)
	return append(b, '}')
}

func appendUnchecked(b []byte, u *Unchecked) []byte {
	b = append(b, `{"kind":`...)
	b = jsonio.AppendString(b, u.Kind)
	b = append(b, `,"name":`...)
	b = jsonio.AppendString(b, u.Name)
	b = append(b, `,"box":`...)
	b = appendRegions(appendBox(b, u.Box), u.Regions, u.CVD)
	if u.Emphasis != nil {
		b = append(b, `,"emphasis":{"box":`...)
		b = appendBox(b, u.Emphasis.Box)
		b = append(b, `,"holds":`...)
		b = jsonio.AppendMap(b, u.Emphasis.Holds, appendBool)
		b = append(b, '}')
	}
	return append(b, '}')
}
