package diagram

import (
	"errors"

	"steamcell/fn"
)

// Kinds of diagram error besides ErrUnknownKind (and the errors of
// fn/point and fn/units, passed on for the user's points).
var (
	// ErrTooMany: more points or lines than one picture can show legibly.
	ErrTooMany = errors.New("too many points or lines")
	// ErrBadPoint: a point that is not a list of name=value items, or
	// names a point it comes from that is not given before it.
	ErrBadPoint = errors.New("malformed point")
	// ErrBadRange: an axis range that is empty, reversed, or not positive
	// on a logarithmic axis.
	ErrBadRange = errors.New("bad axis range")
)

// Error is the problem with a request that the caller must change
// (fn.ParamError: which parameter, what kind, what to change).
type Error = fn.ParamError
