package views

import "fogbench/calc/units"

// Fields is what the shared form-field components (textField, selectField,
// fieldError) read from a form's view model: what the user typed and the
// message for a bad field.
type Fields interface {
	Value(name string) string
	Error(name string) string
}

// UnitFields adds, for numberField, the unit chosen beside a field and the
// units its kind offers.
type UnitFields interface {
	Fields
	Unit(name string, kind units.Kind) string
	UnitOptions(kind units.Kind) []string
}
