package server

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"net/http"
	"os"
	"sync"
	"time"
)

// spoolMemBytes is how much of a body is kept in memory; the rest goes to a
// temporary file.
const spoolMemBytes = 1 << 20

// spool is a request body received in full before the answer starts: in
// memory up to spoolMemBytes, beyond that in a temporary file. Receiving
// the body first lets clients that send the whole body before reading the
// answer (most scripting HTTP clients) get a long streamed answer without
// both sides waiting on full socket buffers, while memory stays bounded.
type spool struct {
	mem    []byte
	f      *os.File
	size   int64
	pooled *[]byte // where mem came from, in spoolBufs, to go back there on Close
}

// spoolBufs keeps the memory of bodies up to spoolMemBytes from request to
// request, for a caller that reads its body only until it closes the
// spool (a batch): a fresh buffer of a megabyte costs its pages anew, about
// as much as reading a small batch's rows.
var spoolBufs = sync.Pool{New: func() any { b := make([]byte, 0, spoolMemBytes); return &b }}

// spoolBody receives the body of r, at most limit bytes, moving the read
// and write deadlines on while data arrives (the write deadline runs from
// the start of the request). The caller closes the spool; with pooled, no
// reader of it may be left when it does.
func spoolBody(w http.ResponseWriter, r *http.Request, limit int64, readTimeout, writeTimeout time.Duration, pooled bool) (*spool, error) {
	body := http.MaxBytesReader(w, r.Body, limit)
	rc := http.NewResponseController(w)
	sp := &spool{}
	var buf []byte
	if n := r.ContentLength; n > 0 && n <= spoolMemBytes && n <= limit {
		if pooled {
			sp.pooled = spoolBufs.Get().(*[]byte)
			sp.mem = (*sp.pooled)[:0]
		} else {
			sp.mem = make([]byte, 0, n) // grown once, not by doubling
		}
	} else {
		buf = make([]byte, 64<<10)
	}
	for {
		// A body that fits in memory is read straight into it.
		into := buf
		if buf == nil {
			into = sp.mem[len(sp.mem):cap(sp.mem)]
			if len(into) == 0 {
				buf = make([]byte, 64<<10) // more than Content-Length said
				into = buf
			}
		}
		n, err := body.Read(into)
		if n > 0 {
			if buf == nil {
				sp.mem = sp.mem[:len(sp.mem)+n]
				sp.size += int64(n)
			} else if err := sp.write(into[:n]); err != nil {
				sp.Close()
				return nil, err
			}
			now := time.Now()
			_ = rc.SetReadDeadline(now.Add(readTimeout))
			_ = rc.SetWriteDeadline(now.Add(writeTimeout))
		}
		if err == io.EOF {
			return sp, sp.rewind()
		}
		if err != nil {
			sp.Close()
			var mbe *http.MaxBytesError
			if errors.As(err, &mbe) {
				return nil, errorf(ErrBodyTooLarge, "", "the body is larger than %d bytes, this server's limit; split it into several requests", limit)
			}
			return nil, errorf(ErrBadBody, "", "the body could not be read: %v", err)
		}
	}
}

// Write appends b, so that a spool can take an answer too.
func (sp *spool) Write(b []byte) (int, error) {
	if err := sp.write(b); err != nil {
		return 0, err
	}
	return len(b), nil
}

func (sp *spool) write(b []byte) error {
	sp.size += int64(len(b))
	if sp.f == nil && len(sp.mem)+len(b) <= spoolMemBytes {
		sp.mem = append(sp.mem, b...)
		return nil
	}
	if sp.f == nil {
		f, err := os.CreateTemp("", "steamcell-body-*")
		if err != nil {
			return fmt.Errorf("spool body: %w", err)
		}
		sp.f = f
		if _, err := f.Write(sp.mem); err != nil {
			return fmt.Errorf("spool body: %w", err)
		}
		sp.mem = nil
	}
	if _, err := sp.f.Write(b); err != nil {
		return fmt.Errorf("spool body: %w", err)
	}
	return nil
}

func (sp *spool) rewind() error {
	if sp.f == nil {
		return nil
	}
	if _, err := sp.f.Seek(0, io.SeekStart); err != nil {
		return fmt.Errorf("spool body: %w", err)
	}
	return nil
}

// reader returns the body from its start.
func (sp *spool) reader() io.Reader {
	if sp.f != nil {
		return sp.f
	}
	return bytes.NewReader(sp.mem)
}

// Close removes the temporary file, if any.
func (sp *spool) Close() error {
	if sp != nil && sp.pooled != nil {
		spoolBufs.Put(sp.pooled) // the megabyte as Get gave it, whatever became of mem
		sp.pooled, sp.mem = nil, nil
	}
	if sp == nil || sp.f == nil {
		return nil
	}
	name := sp.f.Name()
	err := sp.f.Close()
	if rerr := os.Remove(name); err == nil {
		err = rerr
	}
	sp.f = nil
	return err
}
