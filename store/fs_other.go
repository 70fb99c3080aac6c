//go:build !unix

package store

// lockFolder has no folder lock to take on this platform: stale restore
// copies are removed even while another restore of the same library runs,
// which fogbench does not support anyway.
func lockFolder(string, bool) (unlock func(), ok bool) { return func() {}, true }

// freeBytes cannot be told on this platform.
func freeBytes(string) int64 { return -1 }
