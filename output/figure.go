package output

import (
	"fmt"
	"image/color"
	"io"
	"math"
	"path/filepath"
	"strconv"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/plotutil"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
)

// PlotNote is written at the foot of every chart flame1d draws.
const PlotNote = "Model predictions: confirm against local codes and licensed practice before using them for safety decisions."

// Chart holds the labels and size common to every chart.
type Chart struct {
	Title string
	// Note is a line of small text under the title: the condition or the
	// case the chart shows. The model-prediction note (PlotNote) is written
	// at the foot of every chart regardless.
	Note   string
	XLabel string
	// YLabel is the y-axis label of single-panel charts (Lines,
	// StackedBars); a Panel carries its own.
	YLabel string
	// YFromZero starts the y axis of single-panel line charts at zero.
	YFromZero bool
	// Width and Height of the drawing; zero means 16 cm wide and 10 cm
	// high for one panel, 4 cm more for each further panel.
	Width, Height vg.Length
}

// Series is one named set of values: one stack layer of a stacked bar
// chart (one value per category) or one curve of a line chart (Y against
// X, a marker on every point).
type Series struct {
	Name string
	X    []float64 // line charts only
	Y    []float64
	// Breaks lists the indices i at which the line is not drawn from point
	// i-1 to point i (a failed point lies between them); the markers stay.
	Breaks []int
	// Color of the curve; nil means the palette colour of the series'
	// place in its panel.
	Color color.Color
	// Dash selects the line pattern: 0 solid, 1 dashed, 2 dotted, 3
	// dash-dot (e.g. one per fuel where colour marks the species).
	Dash int
	// YErr, when non-nil (line charts, one per point), draws a symmetric
	// error bar of ±YErr at each point; zeros draw none.
	YErr []float64
	// YLow and YHigh, when non-nil (one per point, instead of YErr), draw
	// a bar from YLow to YHigh at each point: a measured scatter band.
	YLow, YHigh []float64
	// NoLine draws the markers only (measurements).
	NoLine bool
}

// Break marks a gap after the series' last point (a failed point lies
// there): the line will not join it to the next point added. Repeated
// breaks and a break before the first point are one break or none.
func (s *Series) Break() {
	if n := len(s.X); n > 0 && (len(s.Breaks) == 0 || s.Breaks[len(s.Breaks)-1] != n) {
		s.Breaks = append(s.Breaks, n)
	}
}

// dashes are the line patterns of Series.Dash.
var dashes = [][]vg.Length{nil, {6, 3}, {1.5, 2}, {6, 2, 1.5, 2}}

// Band is a shaded interval of x drawn behind a panel's curves, e.g. a
// reaction zone.
type Band struct {
	From, To float64
	Color    color.Color // drawn translucent
}

// BarRow is one row of a horizontal-bar panel: a bar from From to To with
// Text written just right of its end. A row with From == To has no bar,
// only its text (e.g. "not consumed in the domain"). Label is the y-axis
// label of the row; a row with a label after the first starts a new group
// and gets a thin rule above it.
type BarRow struct {
	Label    string
	From, To float64
	Text     string
	Color    color.Color
}

// BarKey is a legend entry of a bar colour, for bar panels.
type BarKey struct {
	Name  string
	Color color.Color
}

// Panel is one plot of a figure of panels stacked on a shared x axis. It
// holds curves (Series, over Bands) or horizontal bars (Rows), not both.
type Panel struct {
	YLabel string
	Series []Series
	Bands  []Band
	Rows   []BarRow
	Keys   []BarKey // legend of the bar colours
	// Rules are x positions of thin dashed vertical lines over the bars
	// (e.g. the heat-release peak the bars are aligned at).
	Rules []float64
	// YFromZero starts the y axis at zero (curves only).
	YFromZero bool
	// Weight is the panel's share of the figure height relative to the
	// other panels; zero means 1.
	Weight float64
}

// palette is a qualitative colour set of twelve distinguishable hues;
// series beyond twelve repeat it.
var palette = []color.RGBA{
	{31, 119, 180, 255}, {255, 127, 14, 255}, {44, 160, 44, 255}, {214, 39, 40, 255},
	{148, 103, 189, 255}, {140, 86, 75, 255}, {227, 119, 194, 255}, {188, 189, 34, 255},
	{23, 190, 207, 255}, {174, 199, 232, 255}, {255, 187, 120, 255}, {152, 223, 138, 255},
}

// SeriesColor returns the colour of series i.
func SeriesColor(i int) color.Color { return palette[i%len(palette)] }

// Lines writes a line chart of the series (Y against X, a marker on every
// computed point) to path, in the format named by the extension, atomically.
// It refuses non-finite values and X/Y of different lengths.
func Lines(path string, c Chart, series []Series) error {
	return StackedPanels(path, c, []Panel{{YLabel: c.YLabel, Series: series, YFromZero: c.YFromZero}})
}

// StackedPanels writes panels stacked top to bottom on one shared x axis
// (labelled c.XLabel under the bottom panel), each with its legend in a
// column to the right of the axes so that no legend hides data, the title
// and note on top and PlotNote at the foot. The format is named by the
// extension of path (.svg, .png, .pdf, .eps, .jpg, .tif); the file is
// written atomically. It refuses non-finite values.
func StackedPanels(path string, c Chart, panels []Panel) error {
	if len(panels) == 0 {
		return fmt.Errorf("chart %s: no panels", path)
	}
	fps := make([]figurePanel, len(panels))
	xmin, xmax := math.Inf(1), math.Inf(-1)
	for i, pn := range panels {
		fp, err := buildPanel(pn)
		if err != nil {
			return fmt.Errorf("chart %s: %w", path, err)
		}
		if i == len(panels)-1 {
			fp.plot.X.Label.Text = c.XLabel
		} else {
			fp.plot.X.Tick.Marker = unlabelledTicks{fp.plot.X.Tick.Marker}
		}
		xmin, xmax = math.Min(xmin, fp.plot.X.Min), math.Max(xmax, fp.plot.X.Max)
		fps[i] = fp
	}
	// Air between the outermost points or bar ends and the frame.
	xmin, xmax = widen(xmin, xmax, 0.03)
	for _, fp := range fps {
		fp.plot.X.Min, fp.plot.X.Max = xmin, xmax
	}
	if c.Height == 0 {
		c.Height = 10*vg.Centimeter + vg.Length(len(panels)-1)*4*vg.Centimeter
	}
	return writeFigure(path, c, fps, func(dataWidth vg.Length) error {
		// Texts that fit nowhere beside their bars widen the axis to the
		// right; then every text is placed on the final axis.
		need := xmax
		for i, pn := range panels {
			for _, r := range pn.Rows {
				if r.Text != "" {
					need = math.Max(need, roomNeeded(fps[i].barText, r, xmin, xmax, dataWidth))
				}
			}
		}
		for _, fp := range fps {
			fp.plot.X.Max = need
		}
		for i, pn := range panels {
			if err := placeBarTexts(fps[i], pn.Rows, xmin, need, dataWidth); err != nil {
				return err
			}
		}
		return nil
	})
}

// legendFontSize is the size of legend entries: smaller than the axis
// labels, so the legend column leaves the data most of the width.
const legendFontSize = vg.Length(9)

// barTextOffset is the gap between a bar's end and its text.
const barTextOffset = vg.Length(3)

// figurePanel is a built plot with its legend.
type figurePanel struct {
	plot    *plot.Plot
	legend  plot.Legend
	names   []string
	weight  float64
	barText draw.TextStyle // style of the texts of bar rows
}

// roomNeeded is the axis maximum at which the text of bar r fits inside
// the bar, right of it or left of it on an axis from xmin to xmax, dataWidth
// long; xmax itself when it fits already. Right of a bar ending at e, text
// of f = (width)/(dataWidth) of the axis length fits when
// xmax' >= e + f (xmax' - xmin).
func roomNeeded(sty draw.TextStyle, r BarRow, xmin, xmax float64, dataWidth vg.Length) float64 {
	if barTextSide(sty, r, xmin, xmax, dataWidth) != textOverflows {
		return xmax
	}
	f := math.Min(0.6, float64((sty.Width(r.Text)+2*barTextOffset)/dataWidth))
	return (math.Max(r.From, r.To) - f*xmin) / (1 - f)
}

type textSide int

const (
	textInside textSide = iota
	textRight
	textLeft
	textOverflows
)

// barTextSide chooses where the text of a bar goes: inside the bar if it
// fits there, else right of its end, else left of its start.
func barTextSide(sty draw.TextStyle, r BarRow, xmin, xmax float64, dataWidth vg.Length) textSide {
	perUnit := float64(dataWidth) / (xmax - xmin) // points per axis unit
	lo, hi := math.Min(r.From, r.To), math.Max(r.From, r.To)
	w := float64(sty.Width(r.Text) + 2*barTextOffset)
	switch {
	case (hi-lo)*perUnit >= w:
		return textInside
	case (xmax-hi)*perUnit >= w:
		return textRight
	case (lo-xmin)*perUnit >= w:
		return textLeft
	}
	return textOverflows
}

// placeBarTexts adds the texts of the bar rows to the panel's plot, each
// where barTextSide puts it; text inside a dark bar is white.
func placeBarTexts(fp figurePanel, rows []BarRow, xmin, xmax float64, dataWidth vg.Length) error {
	var texts plotter.XYLabels
	var styles []draw.TextStyle
	n := len(rows)
	for i, r := range rows {
		if r.Text == "" {
			continue
		}
		y := float64(n - 1 - i)
		lo, hi := math.Min(r.From, r.To), math.Max(r.From, r.To)
		sty := fp.barText
		var x float64
		perUnit := float64(dataWidth) / (xmax - xmin)
		switch barTextSide(sty, r, xmin, xmax, dataWidth) {
		case textInside:
			x, sty.XAlign = (lo+hi)/2, draw.XCenter
			if r.Color != nil && luminance(r.Color) < 0.5 {
				sty.Color = color.White
			}
		case textLeft:
			x, sty.XAlign = lo-float64(barTextOffset)/perUnit, draw.XRight
		default:
			x, sty.XAlign = hi+float64(barTextOffset)/perUnit, draw.XLeft
		}
		texts.XYs = append(texts.XYs, plotter.XY{X: x, Y: y})
		texts.Labels = append(texts.Labels, r.Text)
		styles = append(styles, sty)
	}
	if len(texts.Labels) == 0 {
		return nil
	}
	lb, err := plotter.NewLabels(texts)
	if err != nil {
		return err
	}
	lb.TextStyle = styles
	fp.plot.Add(lb)
	return nil
}

// luminance is the relative luminance of a colour, 0 (black) to 1 (white),
// with the Rec. 709 weights (ITU-R BT.709).
func luminance(c color.Color) float64 {
	r, g, b, _ := c.RGBA()
	return (0.2126*float64(r) + 0.7152*float64(g) + 0.0722*float64(b)) / 0xffff
}

// newFigurePanel wraps a plot with an empty legend (entries from the top,
// smaller than the axis labels) and the bar-text style; weight <= 0 means 1.
func newFigurePanel(p *plot.Plot, weight float64) figurePanel {
	fp := figurePanel{plot: p, legend: plot.NewLegend(), weight: weight}
	if fp.weight <= 0 {
		fp.weight = 1
	}
	fp.legend.Left, fp.legend.Top = true, true
	fp.legend.TextStyle.Font.Size = legendFontSize
	fp.legend.Padding = vg.Points(2)
	fp.barText = p.Y.Tick.Label
	fp.barText.Font.Size = vg.Points(8)
	fp.barText.YAlign = draw.YCenter
	return fp
}

func buildPanel(pn Panel) (figurePanel, error) {
	p := plot.New()
	p.Y.Label.Text = pn.YLabel
	p.X.Tick.Marker, p.Y.Tick.Marker = niceTicks{}, niceTicks{}
	fp := newFigurePanel(p, pn.Weight)
	if len(pn.Rows) > 0 {
		if err := addBarRows(&fp, pn); err != nil {
			return fp, err
		}
		return fp, nil
	}
	if len(pn.Series) == 0 {
		return fp, fmt.Errorf("panel %q has neither curves nor bars", pn.YLabel)
	}
	for _, b := range pn.Bands {
		p.Add(band{Band: b})
	}
	p.Add(grid{horizontal: true})
	for i, s := range pn.Series {
		if err := addSeries(&fp, i, s); err != nil {
			return fp, err
		}
	}
	if pn.YFromZero {
		p.Y.Min = 0
	}
	// Headroom, so that the highest points are not drawn on the frame.
	lo := p.Y.Min
	p.Y.Min, p.Y.Max = widen(p.Y.Min, p.Y.Max, 0.04)
	if pn.YFromZero || lo >= 0 && p.Y.Min < 0 {
		p.Y.Min = lo
	}
	return fp, nil
}

// addSeries draws one curve, broken at s.Breaks, with a marker on every
// point, and adds it to the panel's legend.
func addSeries(fp *figurePanel, i int, s Series) error {
	if len(s.X) != len(s.Y) || len(s.X) == 0 {
		return fmt.Errorf("series %q has %d x and %d y values", s.Name, len(s.X), len(s.Y))
	}
	xy := make(plotter.XYs, len(s.X))
	for j := range s.X {
		if !finite(s.X[j]) || !finite(s.Y[j]) {
			return fmt.Errorf("series %q, point %d is not finite", s.Name, j+1)
		}
		xy[j].X, xy[j].Y = s.X[j], s.Y[j]
	}
	clr := s.Color
	if clr == nil {
		clr = SeriesColor(i)
	}
	lineStyle := draw.LineStyle{Color: clr, Width: vg.Points(1.2), Dashes: dashes[s.Dash%len(dashes)]}
	var first *plotter.Line
	start := 0
	for _, end := range append(append([]int(nil), s.Breaks...), len(xy)) {
		if end-start > 1 && !s.NoLine {
			l, err := plotter.NewLine(xy[start:end])
			if err != nil {
				return err
			}
			l.LineStyle = lineStyle
			fp.plot.Add(l)
			if first == nil {
				first = l
			}
		}
		start = max(start, end)
	}
	sc, err := plotter.NewScatter(xy)
	if err != nil {
		return err
	}
	sc.GlyphStyle = draw.GlyphStyle{Color: clr, Radius: markerRadius(len(xy)), Shape: plotutil.Shape(i)}
	fp.plot.Add(sc)
	if err := addErrorBars(fp.plot, xy, s, clr); err != nil {
		return err
	}
	if s.Name != "" {
		if first != nil {
			fp.legend.Add(s.Name, first, sc)
		} else {
			fp.legend.Add(s.Name, sc)
		}
		fp.names = append(fp.names, s.Name)
	}
	return nil
}

// markerRadius shrinks the markers of long series (a refined flame grid
// has hundreds of points) so that they mark the points without hiding the
// curve: 2.2 pt up to 20 points, 0.9 pt from 150.
func markerRadius(points int) vg.Length {
	f := math.Min(1, math.Max(0, float64(points-20)/130))
	return vg.Points(2.2 - 1.3*f)
}

// addBarRows draws the rows top to bottom, each bar a band of 0.6 of the
// row height with its text right of its end.
func addBarRows(fp *figurePanel, pn Panel) error {
	p := fp.plot
	p.Add(grid{})
	for _, x := range pn.Rules {
		p.Add(xRule{x: x})
	}
	n := len(pn.Rows)
	labels := make([]string, n)
	for i, r := range pn.Rows {
		if !finite(r.From) || !finite(r.To) {
			return fmt.Errorf("bar %q (%s): ends are not finite", r.Label, r.Text)
		}
		y := float64(n - 1 - i)
		labels[n-1-i] = r.Label
		lo, hi := math.Min(r.From, r.To), math.Max(r.From, r.To)
		if hi > lo {
			bar, err := plotter.NewPolygon(plotter.XYs{{X: lo, Y: y - 0.3}, {X: hi, Y: y - 0.3}, {X: hi, Y: y + 0.3}, {X: lo, Y: y + 0.3}})
			if err != nil {
				return err
			}
			bar.Color = r.Color
			bar.LineStyle.Width = 0
			p.Add(bar)
		}
		if i > 0 && r.Label != "" {
			p.Add(rowRule{y: y + 0.5})
		}
	}
	p.NominalY(labels...)
	p.Y.Min, p.Y.Max = -0.6, float64(n)-0.4
	for _, k := range pn.Keys {
		box, err := plotter.NewPolygon(plotter.XYs{{}, {X: 1}, {X: 1, Y: 1}})
		if err != nil {
			return err
		}
		box.Color = k.Color
		box.LineStyle.Width = 0
		fp.legend.Add(k.Name, box)
		fp.names = append(fp.names, k.Name)
	}
	return nil
}

// writeFigure lays the panels out (title, panels with aligned data areas
// and their legends to the right, note at the foot), lets fit adjust the
// axes to the width of the data area, and writes the drawing atomically.
func writeFigure(path string, c Chart, panels []figurePanel, fit func(dataWidth vg.Length) error) error {
	w, h := c.Width, c.Height
	if w == 0 {
		w = 16 * vg.Centimeter
	}
	if h == 0 {
		h = 10 * vg.Centimeter
	}
	cw, err := newCanvas(path, w, h)
	if err != nil {
		return err
	}
	dc := draw.New(cw)
	pad := vg.Points(6)

	titleStyle := plot.New().Title.TextStyle
	titleStyle.XAlign, titleStyle.YAlign = draw.XCenter, draw.YTop
	noteStyle := titleStyle
	noteStyle.Font.Size = vg.Points(8)
	noteStyle.Color = color.Gray{Y: 90}
	top := dc.Max.Y - pad
	if c.Title != "" {
		dc.FillText(titleStyle, vg.Point{X: w / 2, Y: top}, c.Title)
		top -= titleStyle.Height(c.Title)
	}
	if c.Note != "" {
		dc.FillText(noteStyle, vg.Point{X: w / 2, Y: top}, c.Note)
		top -= noteStyle.Height(c.Note)
	}
	top -= pad / 2
	foot := noteStyle
	foot.XAlign, foot.YAlign = draw.XLeft, draw.YBottom
	dc.FillText(foot, vg.Point{X: pad, Y: pad / 2}, PlotNote)
	bottom := dc.Min.Y + pad/2 + foot.Height(PlotNote) + pad/2

	legW := vg.Length(0)
	for _, fp := range panels {
		for _, name := range fp.names {
			legW = max(legW, fp.legend.ThumbnailWidth+fp.legend.TextStyle.Rectangle(" "+name).Max.X)
		}
	}
	legW = min(legW, w*0.4)
	right := w - pad
	if legW > 0 {
		right -= legW + pad
	}

	canvases := layoutPanels(dc, panels, pad/2, right, bottom, top)
	if fit != nil {
		da := panels[0].plot.DataCanvas(canvases[0])
		if err := fit(da.Max.X - da.Min.X); err != nil {
			return fmt.Errorf("chart %s: %w", path, err)
		}
		canvases = layoutPanels(dc, panels, pad/2, right, bottom, top)
	}
	for i, fp := range panels {
		fp.plot.Draw(canvases[i])
		if len(fp.names) > 0 {
			lc := canvases[i]
			lc.Min.X, lc.Max.X = w-pad-legW, w-pad
			lc.Max.Y -= pad / 2
			fp.legend.Draw(lc)
		}
	}
	return WriteFileAtomic(path, func(out io.Writer) error {
		_, err := cw.WriteTo(out)
		return err
	})
}

// pngDPI is the resolution of PNG charts: sharp on a laptop screen and in
// a report, where the library's default of 96 dpi looks blurred.
const pngDPI = 150

// newCanvas makes the drawing canvas for the format named by the extension
// of path.
func newCanvas(path string, w, h vg.Length) (vg.CanvasWriterTo, error) {
	format := strings.TrimPrefix(strings.ToLower(filepath.Ext(path)), ".")
	if format == "png" {
		return vgimg.PngCanvas{Canvas: vgimg.NewWith(vgimg.UseWH(w, h), vgimg.UseDPI(pngDPI))}, nil
	}
	cw, err := draw.NewFormattedCanvas(w, h, format)
	if err != nil {
		return nil, fmt.Errorf("chart %s: %w", path, err)
	}
	return cw, nil
}

// layoutPanels splits the area between left/right and bottom/top into one
// canvas per panel by weight, then narrows each so that all data areas have
// the same left and right edges (the x axes line up).
func layoutPanels(dc draw.Canvas, panels []figurePanel, left, right, bottom, top vg.Length) []draw.Canvas {
	total := 0.0
	for _, fp := range panels {
		total += fp.weight
	}
	canvases := make([]draw.Canvas, len(panels))
	y := top
	var maxL, maxR vg.Length
	for i, fp := range panels {
		hgt := (top - bottom) * vg.Length(fp.weight/total)
		cv := dc
		cv.Min = vg.Point{X: left, Y: y - hgt}
		cv.Max = vg.Point{X: right, Y: y}
		y -= hgt
		canvases[i] = cv
		da := fp.plot.DataCanvas(cv)
		maxL = max(maxL, da.Min.X-cv.Min.X)
		maxR = max(maxR, cv.Max.X-da.Max.X)
	}
	for i, fp := range panels {
		da := fp.plot.DataCanvas(canvases[i])
		canvases[i].Min.X += maxL - (da.Min.X - canvases[i].Min.X)
		canvases[i].Max.X -= maxR - (canvases[i].Max.X - da.Max.X)
	}
	return canvases
}

// niceTicks marks three to seven labelled steps of 1, 2 or 5 times a power of
// ten across the axis, with unlabelled minor ticks between them (the
// library's default labels only two or three, e.g. 0 and 2.5 on an S_L
// axis up to 2.9 m/s).
type niceTicks struct{}

func (niceTicks) Ticks(lo, hi float64) []plot.Tick {
	if !(hi > lo) || !finite(lo) || !finite(hi) {
		return nil
	}
	// The largest step of 1, 2 or 5 × 10^n that fits three times: three to
	// seven labels.
	span := hi - lo
	step, minors := math.Pow(10, math.Ceil(math.Log10(span))), 5
	for _, f := range []struct {
		factor float64
		minors int
	}{{0.5, 5}, {0.4, 4}, {0.5, 5}, {0.5, 5}, {0.4, 4}, {0.5, 5}} {
		if span/step >= 3*(1-1e-9) {
			break
		}
		step, minors = step*f.factor, f.minors
	}
	decimals := max(0, int(-math.Floor(math.Log10(step)+1e-9)))
	label := func(v float64) string {
		if math.Abs(v) < step*1e-9 {
			return "0"
		}
		if step < 1e-3 || step >= 1e6 {
			return strconv.FormatFloat(v, 'g', 3, 64)
		}
		return strconv.FormatFloat(v, 'f', decimals, 64)
	}
	var ticks []plot.Tick
	minor := step / float64(minors)
	for k := math.Ceil(lo/minor - 1e-9); k*minor <= hi+minor*1e-9; k++ {
		v := k * minor
		t := plot.Tick{Value: v}
		if int(math.Round(k))%minors == 0 {
			t.Label = label(v)
		}
		ticks = append(ticks, t)
	}
	return ticks
}

// unlabelledTicks keeps the tick marks of an inner panel of a stack and
// drops their labels (the bottom panel carries them).
type unlabelledTicks struct{ plot.Ticker }

func (u unlabelledTicks) Ticks(lo, hi float64) []plot.Tick {
	ts := u.Ticker.Ticks(lo, hi)
	for i := range ts {
		ts[i].Label = ""
	}
	return ts
}

// band fills an x interval over the full height of the data area.
type band struct{ Band }

func (b band) Plot(c draw.Canvas, p *plot.Plot) {
	trX, _ := p.Transforms(&c)
	x0 := max(c.Min.X, min(c.Max.X, trX(math.Min(b.From, b.To))))
	x1 := max(c.Min.X, min(c.Max.X, trX(math.Max(b.From, b.To))))
	if x1 <= x0 {
		return
	}
	r, g, bl, _ := b.Color.RGBA()
	fill := color.NRGBA{R: uint8(r >> 8), G: uint8(g >> 8), B: uint8(bl >> 8), A: 60}
	c.FillPolygon(fill, []vg.Point{{X: x0, Y: c.Min.Y}, {X: x1, Y: c.Min.Y}, {X: x1, Y: c.Max.Y}, {X: x0, Y: c.Max.Y}})
}

// rowRule is a thin horizontal line across the data area between groups
// of bar rows.
type rowRule struct{ y float64 }

func (r rowRule) Plot(c draw.Canvas, p *plot.Plot) {
	_, trY := p.Transforms(&c)
	y := trY(r.y)
	c.StrokeLine2(draw.LineStyle{Color: color.Gray{Y: 160}, Width: vg.Points(0.5)}, c.Min.X, y, c.Max.X, y)
}

// xRule is a thin dashed vertical line across the data area.
type xRule struct{ x float64 }

func (r xRule) Plot(c draw.Canvas, p *plot.Plot) {
	trX, _ := p.Transforms(&c)
	x := trX(r.x)
	if x < c.Min.X || x > c.Max.X {
		return
	}
	c.StrokeLine2(draw.LineStyle{Color: color.Gray{Y: 60}, Width: vg.Points(0.8), Dashes: []vg.Length{3, 2}}, x, c.Min.Y, x, c.Max.Y)
}

// grid draws light lines at the major (labelled) ticks: vertical always,
// horizontal unless it is a bar panel's. It reads the ticks past
// unlabelledTicks, so inner panels of a stack keep their vertical lines.
type grid struct{ horizontal bool }

func (g grid) Plot(c draw.Canvas, p *plot.Plot) {
	sty := draw.LineStyle{Color: color.Gray{Y: 196}, Width: vg.Points(0.5)}
	trX, trY := p.Transforms(&c)
	marker := p.X.Tick.Marker
	if u, ok := marker.(unlabelledTicks); ok {
		marker = u.Ticker
	}
	for _, t := range marker.Ticks(p.X.Min, p.X.Max) {
		if t.Label != "" && t.Value >= p.X.Min && t.Value <= p.X.Max {
			x := trX(t.Value)
			c.StrokeLine2(sty, x, c.Min.Y, x, c.Max.Y)
		}
	}
	if !g.horizontal {
		return
	}
	for _, t := range p.Y.Tick.Marker.Ticks(p.Y.Min, p.Y.Max) {
		if t.Label != "" && t.Value >= p.Y.Min && t.Value <= p.Y.Max {
			y := trY(t.Value)
			c.StrokeLine2(sty, c.Min.X, y, c.Max.X, y)
		}
	}
}

// widen pads the range [lo, hi] by frac of its length on each side; a
// range of one value (one point, or all equal) becomes that value ± 10%
// (± 1 for zero).
func widen(lo, hi, frac float64) (float64, float64) {
	if hi <= lo {
		d := 0.1 * math.Abs(lo)
		if d == 0 {
			d = 1
		}
		return lo - d, hi + d
	}
	m := frac * (hi - lo)
	return lo - m, hi + m
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
