package plan

import (
	"errors"
	"fmt"
	"strings"

	"forelay/scenario"
)

// ErrNoFutureEvent: the event asked for does not act on the plan's
// periods, because the file has no such event or because it lies before
// the plan and is only cleaned out of the history.
var ErrNoFutureEvent = errors.New("not a future event of the plan")

// FutureEvent returns the future event called id (see Plan.Future). When
// there is none the error wraps ErrNoFutureEvent and says why: the event
// lies before the plan's first period, or the file has no such event (the
// message then lists the future events).
func (p *Plan) FutureEvent(id string) (*scenario.Event, error) {
	var ids []string
	for _, e := range p.Future {
		if e.ID == id {
			return e, nil
		}
		ids = append(ids, e.ID)
	}
	if p.File.Event(id) != nil {
		return nil, &eventError{fmt.Sprintf("the event lies before the plan's first period %s, so it is only cleaned out of the history (see the cleaning estimates)", p.Periods[0])}
	}
	return nil, &eventError{fmt.Sprintf("%s has no such event (its future events: %s)", p.File.Path, strings.Join(ids, ", "))}
}

// eventError is an ErrNoFutureEvent whose message is the reason alone, so
// that a caller can put it after the flag or key that named the event.
type eventError struct{ msg string }

func (e *eventError) Error() string { return e.msg }
func (e *eventError) Unwrap() error { return ErrNoFutureEvent }
