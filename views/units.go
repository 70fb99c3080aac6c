package views

// htmxConfig is read by htmx from a meta tag. The Content-Security-Policy
// forbids inline styles, so htmx must not inject its indicator style (the CSS
// file has it); a 422 (form with marked fields) is swapped in like a 200.
const htmxConfig = `{"includeIndicatorStyles":false,"responseHandling":[{"code":"204","swap":false},{"code":"[23]..","swap":true},{"code":"422","swap":true},{"code":"[45]..","swap":false,"error":true}]}`

// UnitSystems lists the unit systems the header switch offers.
func UnitSystems() []Option {
	return []Option{{"si", "SI (kPa, °C, g/s)"}, {"us", "US customary (psi, °F, lb/h)"}}
}
