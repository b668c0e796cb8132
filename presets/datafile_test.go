package presets

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"undercool/presets/units"
)

// Columns of a measured data set, as a user brings for a fit: the numbers in
// the files below are invented for the tests.
var testColumns = []Column{
	{Quantity: "temperature", Kind: units.Temperature, Required: true},
	{Quantity: "time", Kind: units.Time},
	{Quantity: "diffusivity", Kind: units.Diffusivity},
	{Quantity: "rate", Kind: units.RateDensity},
	{Quantity: "fraction", Kind: units.Dimensionless},
}

func near(a, b float64) bool { return math.Abs(a-b) <= 1e-12*math.Max(math.Abs(a), math.Abs(b)) }

func TestReadData(t *testing.T) {
	const file = `# invented for the test
# temperatures in Celsius, times in minutes

temperature_c, time_min, diffusivity_m2_per_s, rate_per_m3_s, fraction
500, 1.5, 1e-12, 1e10, 0.1
   # an indented comment
  550 ,3,2.5e-12,3e11,0.5

600,6, 7e-12, 2e12, 0.9
`
	d, err := ReadData(strings.NewReader(file), "runs.csv", testColumns)
	if err != nil {
		t.Fatal(err)
	}
	want := map[string][]float64{
		"temperature": {773.15, 823.15, 873.15},
		"time":        {90, 180, 360},
		"diffusivity": {1e-12, 2.5e-12, 7e-12},
		"rate":        {1e10, 3e11, 2e12},
		"fraction":    {0.1, 0.5, 0.9},
	}
	for q, w := range want {
		got := d.Columns[q]
		if len(got) != len(w) {
			t.Errorf("%s: %v, want %v", q, got, w)
			continue
		}
		for i := range w {
			if !near(got[i], w[i]) {
				t.Errorf("%s[%d] = %.15g, want %.15g", q, i, got[i], w[i])
			}
		}
	}
	if wl := []int{5, 7, 9}; len(d.Lines) != 3 || d.Lines[0] != wl[0] || d.Lines[1] != wl[1] || d.Lines[2] != wl[2] {
		t.Errorf("Lines = %v, want %v", d.Lines, wl)
	}
	if d.Headers["diffusivity"] != "diffusivity_m2_per_s" || d.Headers["temperature"] != "temperature_c" {
		t.Errorf("Headers = %v", d.Headers)
	}
	if d.File != "runs.csv" {
		t.Errorf("File = %q", d.File)
	}
}

func TestReadDataUnits(t *testing.T) {
	tests := []struct {
		header, cell string
		q            string
		want         float64
	}{
		{"temperature_k", "300", "temperature", 300},
		{"Temperature_C", "26.85", "temperature", 300},
		{"temperature_f", "80.33", "temperature", 300},
		{"time_s", "120", "time", 120},
		{"time_h", "2", "time", 7200},
		{"diffusivity_cm2_per_s", "1e-5", "diffusivity", 1e-9},
		{"rate_per_cm3_s", "1", "rate", 1e6},
	}
	for _, tt := range tests {
		hdr, row := tt.header, tt.cell
		if tt.q != "temperature" {
			hdr, row = "temperature_k,"+hdr, "300,"+row
		}
		d, err := ReadData(strings.NewReader(hdr+"\n"+row+"\n"), "u.csv", testColumns)
		if err != nil {
			t.Errorf("%s: %v", tt.header, err)
			continue
		}
		if got := d.Columns[tt.q][0]; math.Abs(got-tt.want) > 1e-9*math.Abs(tt.want) {
			t.Errorf("%s %s = %.12g, want %g", tt.header, tt.cell, got, tt.want)
		}
	}
}

func TestReadDataErrors(t *testing.T) {
	tests := []struct {
		name, file string
		want       []string
	}{
		{"missing unit", "temperature,time_s\n300,1\n", []string{"d.csv:1:", `"temperature" needs a unit`, "temperature_k"}},
		{"missing unit, not bare", "temperature_k,diffusivity\n300,1e-9\n", []string{"d.csv:1:", `"diffusivity" needs a unit`, "diffusivity_m2_per_s"}},
		{"unknown column", "temperature_k,pressure_pa\n300,1e5\n", []string{"d.csv:1:", `unknown column "pressure_pa"`, "accepted: temperature_UNIT", "time_UNIT", "diffusivity_UNIT", "rate_UNIT", "fraction"}},
		{"unit of the wrong kind", "temperature_kg\n300\n", []string{"d.csv:1:", `"temperature_kg"`, `"kg"`, "not a unit of temperature"}},
		{"missing required column", "time_s,fraction\n1,0.5\n", []string{"d.csv:1:", "missing column for temperature", "accepted:"}},
		{"two columns for one quantity", "temperature_k,temperature_c\n300,27\n", []string{"d.csv:1:", "two columns for temperature"}},
		{"non-numeric value", "# comment\ntemperature_k,time_s\n300,1\n310,soon\n", []string{"d.csv:4:", `"time_s"`, `"soon" is not a finite number`}},
		{"nan", "temperature_k,time_s\n300,nan\n", []string{"d.csv:2:", `"nan" is not a finite number`}},
		{"inf", "temperature_k,time_s\n300,1\n\n310,+Inf\n", []string{"d.csv:4:", `"+Inf" is not a finite number`}},
		{"empty cell", "temperature_k,time_s\n300,\n", []string{"d.csv:2:", `"" is not a finite number`}},
		{"unit in the cell", "temperature_c\n300 K\n", []string{"d.csv:2:", `"300 K"`}},
		{"too many fields", "temperature_k,time_s\n300,1,2\n", []string{"d.csv:2:", "3 fields, header has 2"}},
		{"bad quoting", "temperature_k,time_s\n300,\"1\n", []string{"d.csv:", "not valid CSV"}},
		{"empty file", "", []string{"d.csv", "empty file"}},
		{"only comments", "# nothing\n\n  # here\n", []string{"d.csv", "empty file"}},
		{"header only", "temperature_k,time_s\n", []string{"d.csv", "no data rows"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			d, err := ReadData(strings.NewReader(tt.file), "d.csv", testColumns)
			if err == nil {
				t.Fatalf("no error; data %+v", d)
			}
			for _, w := range tt.want {
				if !strings.Contains(err.Error(), w) {
					t.Errorf("error %q does not contain %q", err, w)
				}
			}
		})
	}
}

func TestReadDataFile(t *testing.T) {
	p := filepath.Join(t.TempDir(), "dg.csv")
	os.WriteFile(p, []byte("temperature_k,dg_kj_per_mol\n800,2.4\n1000,0\n"), 0o644)
	d, err := ReadDataFile(p, nil, drivingColumns)
	if err != nil {
		t.Fatal(err)
	}
	if d.Columns["dg"][0] != 2400 || d.File != p {
		t.Errorf("dg = %v, file %q", d.Columns["dg"], d.File)
	}
	d, err = ReadDataFile("-", strings.NewReader("temperature_c,dg_j_per_mol\n500,100\n"), drivingColumns)
	if err != nil || d.File != "stdin" || !near(d.Columns["temperature"][0], 773.15) {
		t.Errorf("stdin: %+v, %v", d, err)
	}
	missing := filepath.Join(t.TempDir(), "none.csv")
	if _, err := ReadDataFile(missing, nil, drivingColumns); err == nil || !strings.Contains(err.Error(), missing) {
		t.Errorf("missing file error %v should name it", err)
	}
}

// FuzzData: the data reader never panics and returns only finite numbers,
// one per column and row.
func FuzzData(f *testing.F) {
	for _, s := range []string{
		"temperature_c,time_min\n500,1.5\n",
		"# c\n\ntemperature_k, diffusivity_m2_per_s\n 300 ,1e-9\n",
		"temperature_k,rate_per_m3_s,fraction\n300,1e10,0.5\n310,nan,1\n",
		"temperature_k\n\"300\n", "\"", ",,,\n,,,\n", "temperature\n1\n", "  # x\ntemperature_f\n-40\n",
	} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		d, err := ReadData(strings.NewReader(s), "f.csv", testColumns)
		if err != nil {
			return
		}
		for q, col := range d.Columns {
			if len(col) != len(d.Lines) {
				t.Fatalf("%s has %d values for %d rows", q, len(col), len(d.Lines))
			}
			for _, v := range col {
				if math.IsNaN(v) || math.IsInf(v, 0) {
					t.Fatalf("%s holds %v", q, v)
				}
			}
		}
	})
}
