"""One router per resource family."""
