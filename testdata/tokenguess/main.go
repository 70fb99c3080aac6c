// Command tokenguess measures how many wrong access tokens a running
// fogbench looks at: it sends wrong bearer tokens to GET /api/cases on
// -c keep-alive connections for -d and counts the answers by status (401:
// the token was compared and refused; 429: refused by the per-client
// throttle without being compared). Traffic goes only to the -url given,
// which must be on loopback.
//
//	fogbench serve -addr 127.0.0.1:18431 -token-file TOKEN &
//	go run ./testdata/tokenguess -url http://127.0.0.1:18431 -c 1 -d 5s
package main

import (
	"flag"
	"fmt"
	"io"
	"net"
	"net/http"
	"net/url"
	"os"
	"sort"
	"sync"
	"time"
)

func main() {
	base := flag.String("url", "http://127.0.0.1:8080", "fogbench to try (loopback only)")
	conns := flag.Int("c", 1, "keep-alive connections")
	dur := flag.Duration("d", 5*time.Second, "how long to try")
	flag.Parse()
	u, err := url.Parse(*base)
	if err != nil || u.Hostname() == "" {
		fmt.Fprintln(os.Stderr, "tokenguess: -url must be like http://127.0.0.1:8080")
		os.Exit(2)
	}
	if ip := net.ParseIP(u.Hostname()); u.Hostname() != "localhost" && (ip == nil || !ip.IsLoopback()) {
		fmt.Fprintln(os.Stderr, "tokenguess: only a fogbench on loopback may be tried")
		os.Exit(2)
	}
	var mu sync.Mutex
	counts := map[int]int{}
	stop := time.Now().Add(*dur)
	var wg sync.WaitGroup
	for i := range *conns {
		wg.Add(1)
		go func() {
			defer wg.Done()
			c := &http.Client{Transport: &http.Transport{MaxIdleConnsPerHost: 1, MaxConnsPerHost: 1}}
			for n := 0; time.Now().Before(stop); n++ {
				req, _ := http.NewRequest("GET", *base+"/api/cases", nil)
				req.Header.Set("Authorization", fmt.Sprintf("Bearer wrong-guess-%d-%d-0123456789abcdefghij", i, n))
				status := -1 // transport error
				if resp, err := c.Do(req); err == nil {
					io.Copy(io.Discard, resp.Body)
					resp.Body.Close()
					status = resp.StatusCode
				}
				mu.Lock()
				counts[status]++
				mu.Unlock()
			}
		}()
	}
	wg.Wait()
	var statuses []int
	for s := range counts {
		statuses = append(statuses, s)
	}
	sort.Ints(statuses)
	fmt.Printf("%d connection(s) for %v:", *conns, *dur)
	for _, s := range statuses {
		fmt.Printf(" %d×%d", counts[s], s)
	}
	fmt.Println()
}
