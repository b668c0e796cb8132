package answer

import (
	"math"
	"testing"
)

func TestReadableTime(t *testing.T) {
	for _, tc := range []struct {
		s    float64
		want string
	}{
		{math.Inf(1), "never"},
		{math.NaN(), "never"},
		{1.4e-8, "1.40e-08 s"},
		{0.00144, "0.00144 s"},
		{6.014, "6.01 s"},
		{59.9, "59.9 s"},
		{60, "1.00 min"},
		{173.4, "2.89 min"},
		{7200, "2.00 h"},
		{86400 * 3.5, "3.50 days"},
		{365.25 * 86400 * 5.34, "5.34 years"},
		{365.25 * 86400 * 1.23e5, "1.23e+05 years"},
		{365.25 * 86400 * 36036, "3.60e+04 years"}, // never more than three digits
		{365.25 * 86400 * 3.97e73, "3.97e+73 years"},
	} {
		if got := ReadableTime(tc.s); got != tc.want {
			t.Errorf("ReadableTime(%g) = %q, want %q", tc.s, got, tc.want)
		}
	}
}
