package views

// LoginView asks for a name (for revisions) and, on a shared host, the
// access token.
type LoginView struct {
	Chrome
	Name          string
	Next          string
	Error         string
	TokenRequired bool
	SignedIn      bool
}
