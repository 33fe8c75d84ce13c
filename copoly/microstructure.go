package copoly

// MicrostructureInput asks for the sequence statistics of a copolymer (see [MicrostructureOf]).
type MicrostructureInput struct {
	// Model is the copolymerization model and F1 the feed.
	Model Model
	F1    float64
	// MaxLength is the longest run the run-length distributions tabulate, 1 to [MaxRunLength].
	MaxLength int
	// Batch asks for the statistics of all the polymer made in a batch from F1 up to the overall
	// molar conversion Conversion.
	Batch      bool
	Conversion float64
}

// Microstructure is the sequence of units in a copolymer, as the sequences panel of the page
// shows it.
type Microstructure struct {
	// Sequence holds the statistics of the chain made at the feed ([Model.Sequence]).
	Sequence
	// RunLengths holds the run-length distributions at the feed for a [Terminal] model
	// ([Terminal.RunLengths]), the geometric distributions of its first-order chain; nil for the
	// other models.
	RunLengths *RunLengths
	// Batch holds the statistics averaged over a batch ([Batch.Sequence]) for a [Terminal]
	// model when asked for; nil otherwise.
	Batch *Sequence
}

// MicrostructureOf returns the sequence statistics of the copolymer a model makes at a feed
// and, for the terminal model, its run-length distributions and the average over a batch.
// Errors name the model's parameters, "f1", "maxLength" or "conversion"; a conversion asked for
// with another model is still checked to lie in [0, 1].
func MicrostructureOf(in MicrostructureInput) (*Microstructure, error) {
	s, err := in.Model.Sequence(in.F1)
	if err != nil {
		return nil, err
	}
	out := &Microstructure{Sequence: s}
	t, terminal := in.Model.(Terminal)
	if !terminal {
		if in.Batch {
			// Not used, but a bad value is still an error rather than ignored.
			if err := CheckConversion("conversion", in.Conversion); err != nil {
				return nil, err
			}
		}
		return out, nil
	}
	rl, err := t.RunLengths(in.F1, in.MaxLength)
	if err != nil {
		return nil, err
	}
	out.RunLengths = &rl
	if in.Batch {
		b, err := newBatch(t, in.F1)
		if err != nil {
			return nil, err
		}
		bs, err := b.Sequence(in.Conversion)
		if err != nil {
			return nil, err
		}
		out.Batch = &bs
	}
	return out, nil
}
