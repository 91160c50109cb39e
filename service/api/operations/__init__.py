"""Operations: liveness, readiness and metrics."""
