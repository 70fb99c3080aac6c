//go:build unix

package store

import (
	"os"
	"syscall"
)

// lockFolder takes an exclusive advisory lock (flock) on the folder dir,
// waiting for it when wait is set. The lock ends with unlock or with the
// process, so a killed restore leaves no lock behind.
func lockFolder(dir string, wait bool) (unlock func(), ok bool) {
	f, err := os.Open(dir)
	if err != nil {
		return func() {}, false
	}
	how := syscall.LOCK_EX
	if !wait {
		how |= syscall.LOCK_NB
	}
	if err := syscall.Flock(int(f.Fd()), how); err != nil {
		f.Close()
		return func() {}, false
	}
	return func() { syscall.Flock(int(f.Fd()), syscall.LOCK_UN); f.Close() }, true
}

// freeBytes is the space left to unprivileged writers on the file system
// holding dir, or -1 when it cannot be told.
func freeBytes(dir string) int64 {
	var st syscall.Statfs_t
	if err := syscall.Statfs(dir, &st); err != nil {
		return -1
	}
	return int64(st.Bavail) * int64(st.Bsize)
}
