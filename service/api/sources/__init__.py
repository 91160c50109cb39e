"""/v1/sources: every statement an answer cites, by id, in one versioned document."""
