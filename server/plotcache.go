package server

import (
	"container/list"
	"net/http"
	"strings"
	"sync"

	"fogbench/calc"
	"fogbench/calc/units"
	"fogbench/views"
)

// resultCacheEntries and resultCacheBytes bound the case-result cache: a
// 60-bin case holds about 40 KB of result and 100–200 KB of SVG, so the
// bounds keep it to a few tens of MB at most (docs/performance.md).
const (
	resultCacheEntries = 128
	resultCacheBytes   = 24 << 20
)

// resultKey names one stored case revision as seen in one unit system. The
// store gives every save a new revision, so an entry never outlives the
// content it was drawn from.
type resultKey struct {
	id       int64
	revision int
	system   units.System
}

// caseResults is what fillResults puts into a case view.
type caseResults struct {
	result    *calc.Result
	err       string
	plots     []views.Plot
	superheat *views.Plot
	// panel is views.ResultsPanel drawn for this revision and unit system:
	// the bin table, figures and plots are most of a cached page's drawing
	// time (docs/performance.md), and depend on nothing else.
	panel string
	size  int // approximate bytes held
}

// resultCache is a bounded least-recently-used cache of evaluated cases and
// their rendered SVG plots, safe for concurrent use. Entries are shared
// read-only between requests.
type resultCache struct {
	mu       sync.Mutex
	order    *list.List // front = most recently used; values are *resultItem
	items    map[resultKey]*list.Element
	bytes    int
	maxItems int
	maxBytes int
}

type resultItem struct {
	key resultKey
	val caseResults
}

func newResultCache(maxItems, maxBytes int) *resultCache {
	return &resultCache{order: list.New(), items: map[resultKey]*list.Element{}, maxItems: maxItems, maxBytes: maxBytes}
}

func (c *resultCache) get(k resultKey) (caseResults, bool) {
	c.mu.Lock()
	defer c.mu.Unlock()
	e, ok := c.items[k]
	if !ok {
		return caseResults{}, false
	}
	c.order.MoveToFront(e)
	return e.Value.(*resultItem).val, true
}

func (c *resultCache) put(k resultKey, v caseResults) {
	if v.size > c.maxBytes {
		return
	}
	c.mu.Lock()
	defer c.mu.Unlock()
	if e, ok := c.items[k]; ok {
		c.bytes -= e.Value.(*resultItem).val.size
		e.Value.(*resultItem).val = v
		c.bytes += v.size
		c.order.MoveToFront(e)
	} else {
		c.items[k] = c.order.PushFront(&resultItem{k, v})
		c.bytes += v.size
	}
	for c.order.Len() > c.maxItems || c.bytes > c.maxBytes {
		e := c.order.Back()
		it := e.Value.(*resultItem)
		c.order.Remove(e)
		delete(c.items, it.key)
		c.bytes -= it.val.size
	}
}

// len reports the number of cached entries.
func (c *resultCache) len() int {
	c.mu.Lock()
	defer c.mu.Unlock()
	return c.order.Len()
}

// fillStoredResults is fillResults for a stored case revision: the
// evaluation and its plots come from the cache when this revision was drawn
// before in the same unit system. Servers built without New draw every time.
func (s *Server) fillStoredResults(r *http.Request, v *views.CaseView) {
	if s.results == nil || v.ID <= 0 {
		s.fillResults(r, v)
		return
	}
	k := resultKey{id: v.ID, revision: v.Revision, system: v.Display.System}
	if cr, ok := s.results.get(k); ok {
		v.Result, v.Error, v.Plots, v.SuperheatPlot = cr.result, cr.err, cr.plots, cr.superheat
		v.ResultsHTML = cr.panel
		return
	}
	s.fillResults(r, v)
	if r.Context().Err() != nil {
		// The evaluation may have been cut short: never cache that.
		return
	}
	cr := caseResults{result: v.Result, err: v.Error, plots: v.Plots, superheat: v.SuperheatPlot, size: 1024}
	var panel strings.Builder
	if err := views.ResultsPanel(*v).Render(r.Context(), &panel); err == nil {
		// A failed drawing is not cached; the page then draws the panel
		// itself and reports the failure as usual.
		cr.panel = panel.String()
		v.ResultsHTML = cr.panel
		cr.size += len(cr.panel)
	}
	if res := v.Result; res != nil {
		cr.size += 160 * len(res.Bins)
		if res.History != nil {
			cr.size += 40 * len(res.History.TS)
		}
	}
	for _, p := range v.Plots {
		cr.size += len(p.SVG)
	}
	if v.SuperheatPlot != nil {
		cr.size += len(v.SuperheatPlot.SVG)
	}
	s.results.put(k, cr)
}
