package picker

// shortfall explains an empty result.
func (e *evaluator) shortfall(stock Stock, rejected []string, nearest []Candidate) *Shortfall {
	sf := &Shortfall{Rejected: rejected}
	return sf
}
