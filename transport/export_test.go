package transport

// WorstFit names the fitted quantity with the largest error (tests only).
func (t *Model) WorstFit() string { return t.fit.maxErrWhat }
