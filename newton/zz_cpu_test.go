package newton

import (
	"math/rand/v2"
	"os"
	"runtime"
	"syscall"
	"testing"
	"time"
)

func cpuTime() time.Duration {
	var ru syscall.Rusage
	syscall.Getrusage(syscall.RUSAGE_THREAD, &ru)
	return time.Duration(ru.Utime.Nano())
}

func TestZZCPU(t *testing.T) {
	if os.Getenv("PROBE") == "" {
		t.Skip()
	}
	runtime.LockOSThread()
	defer runtime.UnlockOSThread()
	for _, nb := range [][2]int{{200, 55}, {500, 12}, {100, 116}} {
		m := randomBlockTridiagonal(rand.New(rand.NewPCG(9, 10)), nb[0], nb[1], true)
		rhs := make([]float64, nb[0]*nb[1])
		best := time.Hour
		for i := 0; i < 15; i++ {
			c0 := cpuTime()
			m.Factor()
			m.Solve(rhs)
			best = min(best, cpuTime()-c0)
		}
		t.Logf("N=%d B=%d: %v", nb[0], nb[1], best)
	}
}
