package views

import (
	"fmt"
	"net/http"
)

func statusText(code int) string { return fmt.Sprintf("%d %s", code, http.StatusText(code)) }

func itoa(n int) string { return fmt.Sprint(n) }

func itoa64(n int64) string { return fmt.Sprint(n) }
