package fluid

// Source names where one property of a fluid comes from: the property, the
// method or equation form, and the publication down to table or equation.
type Source struct {
	Property  string `json:"property"`
	Method    string `json:"method"`
	Reference string `json:"reference"`
}
