package diagram

import "errors"

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

// Error is a problem with what a diagram was asked to show: which
// parameter, what kind, and a message saying what to change.
type Error struct {
	Param string
	Kind  error
	Msg   string
}

func (e *Error) Error() string { return e.Msg }

// Unwrap returns the kind.
func (e *Error) Unwrap() error { return e.Kind }
