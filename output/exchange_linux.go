package output

import (
	"errors"

	"golang.org/x/sys/unix"
)

// exchange swaps the folders a and b in one atomic step (renameat2 with
// RENAME_EXCHANGE). It reports false, nil when the file system cannot.
func exchange(a, b string) (bool, error) {
	err := unix.Renameat2(unix.AT_FDCWD, a, unix.AT_FDCWD, b, unix.RENAME_EXCHANGE)
	switch {
	case err == nil:
		return true, nil
	case errors.Is(err, unix.EINVAL), errors.Is(err, unix.ENOSYS), errors.Is(err, unix.EOPNOTSUPP):
		return false, nil
	}
	return false, err
}
