package stockcsv

import "biasbin/store"

// Column lists, in the order Write uses. Required columns must be in the
// header; optional ones may be left out or left empty.
var (
	resistorRequired   = []string{"value", "tolerance", "power", "qty", "bin"}
	resistorOptional   = []string{"tcr", "tech", "knee_c", "max_c", "tags", "note", "lev", "part_number"}
	transistorRequired = []string{"label", "polarity", "hfe_min", "hfe_max", "qty"}
	transistorOptional = []string{"hfe_typ", "hfe_at", "vbe", "vbe_at", "vce_sat", "vceo", "ic_max", "pd",
		"theta_ja", "tj_max", "vaf", "icbo", "bin", "tags", "note", "part_number", "vbe_min", "vbe_max", "vaf_min", "vaf_max"}
)

// Columns returns the required and optional columns of kind k.
func Columns(k store.Kind) (required, optional []string) {
	if k == store.KindTransistor {
		return append([]string(nil), transistorRequired...), append([]string(nil), transistorOptional...)
	}
	return append([]string(nil), resistorRequired...), append([]string(nil), resistorOptional...)
}

// header returns every column of kind k in the order Write uses.
func header(k store.Kind) []string {
	req, opt := Columns(k)
	return append(req, opt...)
}
