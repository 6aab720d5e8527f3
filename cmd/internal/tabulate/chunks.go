package tabulate

import (
	"fmt"
	"io"
	"runtime"

	"github.com/flowregime/flowregime/cmd/internal/batch"
)

// partial is the summary of one chunk of the input.
type partial struct {
	seq     int
	groups  *groupSet
	rejects []batch.Record // records that could not be read, in input order
	err     error
}

// Chunks is Tabulate for a table read a chunk at a time (next is
// batch.Reader.NextChunk, io.EOF after the last): workers goroutines split
// and sum chunks at once, and the sums are merged in input order, so the
// result is Tabulate's on the same rows. Values past opt.Budget are
// spilled to a temporary file, removed before Chunks returns. reject gets each record that
// cannot be read (Err set), in input order; those past a refused grouping
// are not passed on. An error of next is returned as it is.
func Chunks(header []string, next func() (batch.Chunk, error), spec Spec, opt Options, reject func(batch.Record)) ([]Group, error) {
	l, err := newLayout(header, spec)
	if err != nil {
		return nil, err
	}
	workers := opt.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	done := make(chan struct{})
	defer close(done)
	type job struct {
		seq   int
		chunk batch.Chunk
	}
	jobs := make(chan job, workers)
	results := make(chan partial, workers)
	readErr := make(chan error, 1)
	go func() {
		defer close(jobs)
		for seq := 0; ; seq++ {
			c, err := next()
			if err != nil {
				if err != io.EOF {
					readErr <- err
				}
				return
			}
			select {
			case jobs <- job{seq, c}:
			case <-done:
				return
			}
		}
	}()
	running := workers
	for range workers {
		go func() {
			for j := range jobs {
				select {
				case results <- l.sumChunk(j.seq, j.chunk):
				case <-done:
					return
				}
			}
			select {
			case results <- partial{seq: -1}:
			case <-done:
			}
		}()
	}
	groups := newGroupSet(MaxGroups).withBudget(opt.Budget, opt.TempFile)
	defer groups.close()
	waiting := map[int]partial{}
	for want := 0; running > 0; {
		p := <-results
		if p.seq < 0 {
			running--
			continue
		}
		waiting[p.seq] = p
		for p, ok := waiting[want]; ok; p, ok = waiting[want] {
			delete(waiting, want)
			want++
			if err := mergeChunk(l, groups, p, reject); err != nil {
				return nil, err
			}
		}
	}
	select {
	case err := <-readErr:
		return nil, err
	default:
	}
	return l.summarise(groups)
}

// sumChunk sums the records of one chunk. A panic becomes the partial's
// error, not the program's end.
func (l *layout) sumChunk(seq int, c batch.Chunk) (p partial) {
	p = partial{seq: seq, groups: newGroupSet(0)}
	defer func() {
		if r := recover(); r != nil {
			p.err = fmt.Errorf("internal error summing lines near %d: %v", seq, r)
		}
	}()
	c.Each(nil, func(rec batch.Record) {
		if rec.Err != nil {
			p.rejects = append(p.rejects, rec)
			return
		}
		a, _ := p.groups.group(l, rec.Fields, rec.Line) // no limit: no error
		l.add(a, rec.Fields)
	})
	return p
}

// mergeChunk adds chunk p to groups and passes its rejects on, those
// before the first row past a refused grouping only.
func mergeChunk(l *layout, groups *groupSet, p partial, reject func(batch.Record)) error {
	if p.err != nil {
		return p.err
	}
	line, err := groups.merge(l, p.groups)
	for _, r := range p.rejects {
		if err == nil || r.Line < line {
			reject(r)
		}
	}
	return err
}
