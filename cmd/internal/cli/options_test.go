package cli

import (
	"bytes"
	"context"
	"reflect"
	"strings"
	"testing"

	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/report"
	"github.com/flowregime/flowregime/media"
	"github.com/flowregime/flowregime/regime"
	"github.com/spf13/cobra"
)

// captureOptions runs a command line through a fresh command tree in which
// the command is built by build with a runF that only keeps its options:
// flags are parsed and checked, nothing is computed or read. It returns the
// options (nil when runF was not reached), the exit code and stderr.
func captureOptions[O any](t *testing.T, line string, build func(Streams, func(*O) error) *cobra.Command) (*O, int, string) {
	t.Helper()
	var got *O
	var errb bytes.Buffer
	out := &checkedWriter{w: &bytes.Buffer{}}
	s := Streams{In: strings.NewReader(""), Out: out, Err: &errb, outs: newOutputSet()}
	root := NewRoot(s)
	cmd := build(s, func(o *O) error { got = o; return nil })
	for _, c := range root.Commands() {
		if c.Name() == cmd.Name() {
			root.RemoveCommand(c)
		}
	}
	root.AddCommand(cmd)
	code := executeRoot(context.Background(), root, strings.Fields(line), s, out)
	return got, code, errb.String()
}

// optionCase is one command line and what it must give: the options
// (changed from the command's defaults by want) and exit 0, or no options,
// exit 2 and a message containing errHas.
type optionCase[O any] struct {
	line   string
	want   func(*O)
	errHas string
}

func checkOptionCases[O any](t *testing.T, build func(Streams, func(*O) error) *cobra.Command, defaults func() O, cases []optionCase[O]) {
	t.Helper()
	for _, tc := range cases {
		got, code, stderr := captureOptions(t, tc.line, build)
		if tc.want == nil {
			if code != ExitUsage || got != nil || !strings.Contains(stderr, tc.errHas) {
				t.Errorf("%s: exit %d, options reached: %v, stderr %q; want exit %d and %q", tc.line, code, got != nil, stderr, ExitUsage, tc.errHas)
			}
			continue
		}
		want := defaults()
		tc.want(&want)
		if code != ExitOK || got == nil {
			t.Errorf("%s: exit %d, stderr %q", tc.line, code, stderr)
			continue
		}
		if !reflect.DeepEqual(*got, want) {
			t.Errorf("%s:\n got %+v\nwant %+v", tc.line, *got, want)
		}
	}
}

// defaultOrganism is the organism flags with nothing given: only --disc has
// a default.
func defaultOrganism() organismFlags {
	var o organismFlags
	o.fieldFlags[inputs.Disc] = regime.DiscSpan
	return o
}

var defaultUncertainty = uncertaintyFlags{method: regime.MethodMonteCarlo, draws: 10000, seed: 1}

func TestCalcOptions(t *testing.T) {
	defaults := func() calcOptions {
		return calcOptions{organism: defaultOrganism(), medium: media.KindFreshWater, format: report.FormatTable, unc: defaultUncertainty}
	}
	checkOptionCases(t, newCalcCmd, defaults, []optionCase[calcOptions]{
		{line: "calc --length 12mm --speed 3BL/s", want: func(o *calcOptions) {
			o.organism.fieldFlags[inputs.Length], o.organism.fieldFlags[inputs.Speed] = "12mm", "3BL/s"
		}},
		{line: "calc --length 30cm --diameter 5cm --speed 0.6m/s --freq 4Hz --amplitude 6cm --medium seawater --temp 12C --salinity 35psu --depth 40m --format json",
			want: func(o *calcOptions) {
				f := &o.organism.fieldFlags
				f[inputs.Length], f[inputs.Diameter], f[inputs.Speed], f[inputs.Frequency], f[inputs.Amplitude] = "30cm", "5cm", "0.6m/s", "4Hz", "6cm"
				o.medium, o.format = media.KindSeawater, report.FormatJSON
				o.flags.fieldFlags[inputs.Temperature], o.flags.fieldFlags[inputs.Salinity], o.flags.fieldFlags[inputs.Depth] = "12C", "35psu", "40m"
			}},
		{line: "calc --length 16cm --speed 10m/s --mass 40g --span 42cm --medium air --gliding --disc stroke --altitude 500m --humidity 60%",
			want: func(o *calcOptions) {
				f := &o.organism.fieldFlags
				f[inputs.Length], f[inputs.Speed], f[inputs.Mass], f[inputs.Span], f[inputs.Disc] = "16cm", "10m/s", "40g", "42cm", "stroke"
				o.gliding, o.medium = true, media.KindAir
				o.flags.fieldFlags[inputs.Altitude], o.flags.fieldFlags[inputs.Humidity] = "500m", "60%"
			}},
		{line: "calc --length 12±1mm --speed 3BL/s --uncertainty linear --draws 50 --seed 7", want: func(o *calcOptions) {
			o.organism.fieldFlags[inputs.Length], o.organism.fieldFlags[inputs.Speed] = "12±1mm", "3BL/s"
			o.unc = uncertaintyFlags{method: regime.MethodLinear, draws: 50, seed: 7}
		}},
		{line: "calc --length 12mm --speed 1m/s --format xml", errHas: "xml"},
		{line: "calc --length 12mm --speed 1m/s --uncertainty bayes", errHas: "--uncertainty \"bayes\""},
		{line: "calc --length 12mm --speed 1m/s --draws 5", errHas: "--draws 5: give 10 to 10000000"},
		{line: "calc --length 12mm --speed 1m/s --draws ten", errHas: "--draws"},
		{line: "calc --lenght 12mm", errHas: "unknown flag: --lenght"},
		{line: "calc --length", errHas: "flag needs an argument"},
		{line: "calc --length 12mm --speed 1m/s extra", errHas: "extra"},
	})
}

func TestSettleOptions(t *testing.T) {
	defaults := func() settleOptions {
		return settleOptions{medium: media.KindFreshWater, format: report.FormatTable}
	}
	checkOptionCases(t, newSettleCmd, defaults, []optionCase[settleOptions]{
		{line: "settle --diameter 150um --density 1.06g/cm3 --medium seawater --temp 10C", want: func(o *settleOptions) {
			o.diameter, o.density, o.medium = "150um", "1.06g/cm3", media.KindSeawater
			o.flags.fieldFlags[inputs.Temperature] = "10C"
		}},
		{line: "settle --diameter 0.3mm --length 1mm --density 2650kg/m3 --corey-shape 0.7 --roundness 3.5 --shear-rate 2/s --format csv", want: func(o *settleOptions) {
			o.diameter, o.length, o.density, o.coreyShape, o.roundness, o.shearRate, o.format = "0.3mm", "1mm", "2650kg/m3", "0.7", "3.5", "2/s", report.FormatCSV
		}},
		{line: "settle --diameter 25um --density 1100kg/m3 --medium air --humidity 70% --pressure 90kPa", want: func(o *settleOptions) {
			o.diameter, o.density, o.medium = "25um", "1100kg/m3", media.KindAir
			o.flags.fieldFlags[inputs.Humidity], o.flags.fieldFlags[inputs.Pressure] = "70%", "90kPa"
		}},
		{line: "settle --diameter 1mm --density 2g/cm3 --format yaml", errHas: "yaml"},
		{line: "settle --speed 1m/s", errHas: "unknown flag: --speed"},
		{line: "settle --diameter 1mm --density 2g/cm3 grain", errHas: "grain"},
	})
}

func TestMediumOptions(t *testing.T) {
	defaults := func() mediumOptions { return mediumOptions{format: report.FormatTable} }
	checkOptionCases(t, newMediumCmd, defaults, []optionCase[mediumOptions]{
		{line: "medium seawater --temp 12C --salinity 34.5psu --depth 40m", want: func(o *mediumOptions) {
			o.medium = media.KindSeawater
			f := &o.flags.fieldFlags
			f[inputs.Temperature], f[inputs.Salinity], f[inputs.Depth] = "12C", "34.5psu", "40m"
		}},
		{line: "medium air --altitude 2500m --temp-offset 5K --latitude 60 --format json", want: func(o *mediumOptions) {
			o.medium, o.format = media.KindAir, report.FormatJSON
			f := &o.flags.fieldFlags
			f[inputs.Altitude], f[inputs.TempOffset], f[inputs.Latitude] = "2500m", "5K", "60"
		}},
		{line: "medium glycerol:85% --temp 22C", want: func(o *mediumOptions) {
			o.medium = "glycerol:85%"
			o.flags.fieldFlags[inputs.Temperature] = "22C"
		}},
		{line: "medium", errHas: "medium needs one argument"},
		{line: "medium air water", errHas: "medium needs one argument"},
		{line: "medium air --format tsv", errHas: "tsv"},
		{line: "medium air --length 1m", errHas: "unknown flag: --length"},
	})
}

func TestFitOptions(t *testing.T) {
	defaults := func() fitOptions { return fitOptions{format: report.FormatTable} }
	checkOptionCases(t, newFitCmd, defaults, []optionCase[fitOptions]{
		{line: "fit mucus.csv --density 1010kg/m3 --name mucus --save mucus.json", want: func(o *fitOptions) {
			o.input, o.density, o.name, o.save = "mucus.csv", "1010kg/m3", "mucus", "mucus.json"
		}},
		{line: "fit - --input-format tsv --unit rate=1/s --unit stress=mPa --temp 20C --relaxation-time 0.5s --format csv", want: func(o *fitOptions) {
			o.input, o.inFormat, o.temp, o.relaxation, o.format = "-", "tsv", "20C", "0.5s", report.FormatCSV
			o.units = []string{"rate=1/s", "stress=mPa"}
		}},
		{line: "fit", errHas: "fit"},
		{line: "fit a.csv b.csv", errHas: "fit"},
		{line: "fit a.csv --format html", errHas: "html"},
		{line: "fit a.csv --medium air", errHas: "unknown flag: --medium"},
	})
}

func batchDefaults() batchOptions {
	return batchOptions{missing: inputs.DefaultMissing, firstLine: 1, organism: defaultOrganism(), medium: media.KindFreshWater, unc: defaultUncertainty}
}

func TestBatchOptions(t *testing.T) {
	checkOptionCases(t, newBatchCmd, batchDefaults, []optionCase[batchOptions]{
		{line: "batch survey.csv -o results.csv --rejects rejects.csv", want: func(o *batchOptions) {
			o.input, o.output, o.rejects = "survey.csv", "results.csv", "rejects.csv"
		}},
		{line: "batch tags.tsv --medium seawater --temp 8C --format jsonl -q --workers 2 --record run.json", want: func(o *batchOptions) {
			o.input, o.medium, o.outFormat, o.quiet, o.workers, o.record = "tags.tsv", media.KindSeawater, "jsonl", true, 2, "run.json"
			o.flags.fieldFlags[inputs.Temperature] = "8C"
		}},
		{line: "batch - --names a,b,c --first-line 100002 --flagged-only --input-format csv", want: func(o *batchOptions) {
			o.input, o.names, o.firstLine, o.flaggedOnly, o.inFormat = "-", "a,b,c", 100002, true, "csv"
		}},
		{line: "batch s.csv --column length=BL --column speed=U --unit length=mm --ignore Notes --missing NA,-- --media-anywhere --explain --length 2cm",
			want: func(o *batchOptions) {
				o.input, o.mediaAnywhere, o.explain = "s.csv", true, true
				o.columns, o.units, o.ignore, o.missing = []string{"length=BL", "speed=U"}, []string{"length=mm"}, []string{"Notes"}, []string{"NA", "--"}
				o.organism.fieldFlags[inputs.Length] = "2cm"
			}},
		{line: "batch s.csv --draws 100", want: func(o *batchOptions) {
			o.input, o.unc.draws, o.uncOn = "s.csv", 100, true
		}},
		{line: "batch", errHas: "batch"},
		{line: "batch a.csv --workers many", errHas: "--workers"},
		{line: "batch a.csv --by taxon", errHas: "unknown flag: --by"},
	})
}

func TestTabulateOptions(t *testing.T) {
	defaults := func() tabulateOptions {
		// tabulate binds batch's input flags but not --first-line or the
		// uncertainty flags.
		b := batchDefaults()
		b.firstLine, b.unc = 0, uncertaintyFlags{}
		return tabulateOptions{batchOptions: b, format: report.FormatTable, budget: 64}
	}
	checkOptionCases(t, newTabulateCmd, defaults, []optionCase[tabulateOptions]{
		{line: "tabulate survey.csv --by taxon --fit power_W=mass --fit reynolds=length", want: func(o *tabulateOptions) {
			o.input, o.by, o.fits, o.fitSet = "survey.csv", "taxon", []string{"power_W=mass", "reynolds=length"}, true
		}},
		{line: "tabulate survey.csv --by taxon,site --expect power_W=mass:0.75 --format json --medium air", want: func(o *tabulateOptions) {
			o.input, o.by, o.expects, o.format, o.medium = "survey.csv", "taxon,site", []string{"power_W=mass:0.75"}, report.FormatJSON, media.KindAir
		}},
		{line: "tabulate - --by site --format csv --only fits --fit power_W=mass", want: func(o *tabulateOptions) {
			o.input, o.by, o.format, o.only, o.fits, o.fitSet = "-", "site", report.FormatCSV, "fits", []string{"power_W=mass"}, true
		}},
		{line: "tabulate s.csv --memory-budget 8", want: func(o *tabulateOptions) { o.input, o.budget = "s.csv", 8 }},
		{line: "tabulate s.csv --memory-budget 0", errHas: "--memory-budget"},
		{line: "tabulate s.csv --fit power_W=mass --format csv", errHas: "--only"},
		{line: "tabulate s.csv --format pdf", errHas: "pdf"},
		{line: "tabulate", errHas: "tabulate"},
		{line: "tabulate s.csv --rejects r.csv", errHas: "unknown flag: --rejects"},
	})
}

func TestSweepOptions(t *testing.T) {
	// sweep binds calc's organism and medium flags but not --gliding or
	// the uncertainty flags.
	defaults := func() sweepOptions {
		return sweepOptions{calcOptions: calcOptions{organism: defaultOrganism(), medium: media.KindFreshWater, format: report.FormatTable}, steps: 21}
	}
	checkOptionCases(t, newSweepCmd, defaults, []optionCase[sweepOptions]{
		{line: "sweep --vary temperature=0C:30C --steps 31 --length 2mm --speed 5mm/s", want: func(o *sweepOptions) {
			o.vary, o.steps = "temperature=0C:30C", 31
			o.organism.fieldFlags[inputs.Length], o.organism.fieldFlags[inputs.Speed] = "2mm", "5mm/s"
		}},
		{line: "sweep --vary speed=10um/s:1m/s --log --length 1mm --medium air --altitude 500m --format csv", want: func(o *sweepOptions) {
			o.vary, o.log, o.medium, o.format = "speed=10um/s:1m/s", true, media.KindAir, report.FormatCSV
			o.organism.fieldFlags[inputs.Length] = "1mm"
			o.flags.fieldFlags[inputs.Altitude] = "500m"
		}},
		{line: "sweep --vary speed=1:2 --format svg", errHas: "svg"},
		{line: "sweep --vary speed=1:2 --steps x", errHas: "--steps"},
		{line: "sweep --vary speed=1:2 --gliding", errHas: "unknown flag: --gliding"},
	})
}

func TestPowerCurveOptions(t *testing.T) {
	defaults := func() powerCurveCmdOptions {
		return powerCurveCmdOptions{powerCurveOptions: powerCurveOptions{
			calcOptions: calcOptions{organism: defaultOrganism(), medium: media.KindAir, format: report.FormatTable},
			from:        "0.5m/s", to: "30m/s", steps: 60}}
	}
	checkOptionCases(t, newPowerCurveCmd, defaults, []optionCase[powerCurveCmdOptions]{
		{line: "powercurve --length 16cm --diameter 3.5cm --mass 40g --span 42cm --chord 4cm -o swallow.svg", want: func(o *powerCurveCmdOptions) {
			f := &o.organism.fieldFlags
			f[inputs.Length], f[inputs.Diameter], f[inputs.Mass], f[inputs.Span], f[inputs.Chord] = "16cm", "3.5cm", "40g", "42cm", "4cm"
			o.out = "swallow.svg"
		}},
		{line: "powercurve --length 16cm --mass 40g --span 42cm --gliding --from 3m/s --to 20m/s --steps 10 --format json", want: func(o *powerCurveCmdOptions) {
			f := &o.organism.fieldFlags
			f[inputs.Length], f[inputs.Mass], f[inputs.Span] = "16cm", "40g", "42cm"
			o.gliding, o.from, o.to, o.steps, o.format = true, "3m/s", "20m/s", 10, report.FormatJSON
		}},
		{line: "powercurve --length 16cm -o curve.gif", errHas: "gif"},
		{line: "powercurve --length 16cm --format xml", errHas: "xml"},
		{line: "powercurve --length 16cm --steps many", errHas: "--steps"},
	})
}

func TestScaleModelOptions(t *testing.T) {
	defaults := func() scaleOptions {
		return scaleOptions{calc: calcOptions{organism: defaultOrganism(), medium: media.KindFreshWater, format: report.FormatTable},
			tankTemp: "20C", match: matchReynolds}
	}
	checkOptionCases(t, newScaleModelCmd, defaults, []optionCase[scaleOptions]{
		{line: "scalemodel --length 1mm --speed 1cm/s --freq 20Hz --amplitude 0.5mm --medium seawater --model-length 10cm --model-speed 5cm/s",
			want: func(o *scaleOptions) {
				f := &o.calc.organism.fieldFlags
				f[inputs.Length], f[inputs.Speed], f[inputs.Frequency], f[inputs.Amplitude] = "1mm", "1cm/s", "20Hz", "0.5mm"
				o.calc.medium, o.modelLength, o.modelSpeed = media.KindSeawater, "10cm", "5cm/s"
			}},
		{line: "scalemodel --length 30cm --speed 0.6m/s --scale 2 --fluid freshwater --fluid oil --oil-point 20C=65mPas --oil-point 40C=30mPas --oil-density 870kg/m3 --match froude --tank-temp 15C",
			want: func(o *scaleOptions) {
				o.calc.organism.fieldFlags[inputs.Length], o.calc.organism.fieldFlags[inputs.Speed] = "30cm", "0.6m/s"
				o.scale, o.fluids, o.match, o.tankTemp = "2", []string{"freshwater", "oil"}, "froude", "15C"
				o.oilPoints, o.oilDensity = []string{"20C=65mPas", "40C=30mPas"}, "870kg/m3"
			}},
		{line: "scalemodel --length 1mm --speed 1cm/s --scale 10 --mass 2g", errHas: "--mass does not enter a scale model"},
		{line: "scalemodel --length 1mm --speed 1cm/s --scale 10 --format html", errHas: "html"},
		{line: "scalemodel --length 1mm --speed 1cm/s --scale 10 --uncertainty linear", errHas: "unknown flag: --uncertainty"},
	})
}
