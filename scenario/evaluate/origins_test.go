package evaluate

import (
	"slices"
	"testing"
)

func TestOrigins(t *testing.T) {
	tests := []struct {
		name                                string
		n, season, h, step, minSeasons, cap int
		want                                []int
	}{
		// 526 months (co2): 514, 502, ... every 12, capped at 5.
		{"long monthly, capped", 526, 12, 12, 12, 3, 5, []int{514, 502, 490, 478, 466}},
		// 60 months: 48 and 36 (36 = 3 seasons is the least history); 24 is too short.
		{"short monthly", 60, 12, 12, 12, 3, 5, []int{48, 36}},
		// 48 months: only 36.
		{"one origin", 48, 12, 12, 12, 3, 5, []int{36}},
		// 47 months: 35 < 36, none.
		{"too short", 47, 12, 12, 12, 3, 5, nil},
		// 107 quarters (interest_inflation): 99, 91, 83, 75, 67.
		{"quarterly", 107, 4, 8, 8, 3, 5, []int{99, 91, 83, 75, 67}},
		// Half steps: 60 months, step 6: 48, 42, 36.
		{"half step", 60, 12, 12, 6, 3, 5, []int{48, 42, 36}},
		// No season: at least max(3*1, 2) = 3 values of history; 10-4 = 6, 2 is too few.
		{"no season", 10, 1, 4, 4, 3, 5, []int{6}},
		{"bad horizon", 60, 12, 0, 12, 3, 5, nil},
		{"bad step", 60, 12, 12, 0, 3, 5, nil},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			got := Origins(tt.n, tt.season, tt.h, tt.step, tt.minSeasons, tt.cap)
			if !slices.Equal(got, tt.want) {
				t.Errorf("Origins(%d, %d, %d, %d, %d, %d) = %v, want %v",
					tt.n, tt.season, tt.h, tt.step, tt.minSeasons, tt.cap, got, tt.want)
			}
		})
	}
}
