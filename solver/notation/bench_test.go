package notation

import "testing"

func BenchmarkParseResistance(b *testing.B) {
	inputs := []string{"4K7", "27KK", "4.7 kΩ", "470R", "1.5M", "4K7 ±1 %"}
	for i := 0; b.Loop(); i++ {
		if _, _, _, err := ParseResistance(inputs[i%len(inputs)]); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkFormatResistance(b *testing.B) {
	values := []float64{4700, 0.47, 47300, 1e6, 0.0047}
	for i := 0; b.Loop(); i++ {
		FormatResistance(values[i%len(values)])
	}
}
