package project

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math"
	"reflect"
	"strings"

	"copoly/copoly"
)

// MaxFileBytes is the largest project file Parse reads. A valid project is far smaller (the
// notes are limited to MaxNotesBytes); the limit stops a wrong file from using up memory.
const MaxFileBytes = 1 << 20

// Parse reads one project file and validates it.
//
// The data must be a single JSON object (surrounding white space allowed, nothing after it). A
// file that is not a JSON object, or an object holding neither "format" nor any other key a
// project requires, gives an error with field "project" wrapping ErrNotProject; a "format" other
// than Format one naming "project.format" wrapping ErrNotProject. A "version" above Version
// gives an error wrapping ErrNewerVersion. The rest is read by the schema of Project: a required
// key that is missing or null gives ErrMissing, a value of the wrong JSON type ErrWrongType;
// both name the key by its whole path ("project.bench.rows[3].cells.f10") and the wrong value
// ("the text \"0.5\""). Keys are matched exactly; keys this version does not know are ignored.
// Finally the project must pass Project.Validate. The bridge in wasm/ reads the page's project
// objects with Parse too, as JSON text.
func Parse(data []byte) (Project, error) {
	if len(data) > MaxFileBytes {
		return Project{}, notProject(fmt.Sprintf("the file holds %d bytes, more than the %d a project can have", len(data), MaxFileBytes))
	}
	if len(bytes.TrimSpace(data)) == 0 {
		return Project{}, notProject("the file is empty")
	}
	x, err := decodeJSON(data)
	if err != nil {
		if err == errTrailing {
			return Project{}, notProject(err.Error())
		}
		return Project{}, notProject("the file is not valid JSON (" + err.Error() + ")")
	}
	head, ok := x.(map[string]any)
	if !ok {
		return Project{}, notProject(fmt.Sprintf("the file holds a JSON %s, not an object", jsonKind(x)))
	}
	if format := head["format"]; format == nil {
		for _, key := range requiredKeys {
			if head[key] != nil {
				return Project{}, &copoly.FieldError{Field: "project.format", Reason: "is missing", Err: ErrMissing}
			}
		}
		return Project{}, notProject(`it has no "format": "` + Format + `" entry`)
	} else if s, ok := format.(string); !ok {
		return Project{}, wrongType("project.format", "text", format)
	} else if s != Format {
		return Project{}, &copoly.FieldError{Field: "project.format", Reason: fmt.Sprintf("is %q, not %q: not a copoly project", s, Format), Err: ErrNotProject}
	}
	switch version := head["version"].(type) {
	case nil:
		return Project{}, &copoly.FieldError{Field: "project.version", Reason: "is missing", Err: ErrMissing}
	case float64:
		if version != math.Trunc(version) {
			return Project{}, wrongType("project.version", "a whole number", version)
		}
		if err := checkVersion(version); err != nil {
			// A newer file may be laid out differently: stop before reading the rest.
			return Project{}, err
		}
	default:
		return Project{}, wrongType("project.version", "a whole number", version)
	}
	var p Project
	if err := readValue("project", head, reflect.ValueOf(&p).Elem(), ""); err != nil {
		return Project{}, err
	}
	if len(p.JCR) == 0 {
		p.JCR = nil // "jcr": [] is no region, as Marshal writes it (by leaving the key out)
	}
	if p.Bench != nil {
		p.Bench.tidy()
	}
	if p.Plan != nil && len(p.Plan.TimeTable) == 0 {
		p.Plan.TimeTable = nil // likewise "timeTable": [] is no table
	}
	// Likewise "triads": [], "sizeBins": [], "userMonomers": [] and "hazards": [] are none.
	if len(p.Triads) == 0 {
		p.Triads = nil
	}
	if len(p.SizeBins) == 0 {
		p.SizeBins = nil
	}
	if len(p.UserMonomers) == 0 {
		p.UserMonomers = nil
	}
	for i := range p.UserMonomers {
		if len(p.UserMonomers[i].Hazards) == 0 {
			p.UserMonomers[i].Hazards = nil
		}
	}
	if err := p.Validate(); err != nil {
		return Project{}, err
	}
	return p, nil
}

// requiredKeys are the keys of a project file, besides "format", that must hold a value; an
// object with none of them is not a project at all.
var requiredKeys = []string{"version", "monomer1", "monomer2", "r1", "r2", "f10", "conversion", "tolerance"}

// jsonKind names the kind of a decoded JSON value as JSON does: array, string, number, bool,
// null or object.
func jsonKind(x any) string {
	switch x.(type) {
	case []any:
		return "array"
	case string:
		return "string"
	case float64:
		return "number"
	case bool:
		return "bool"
	case nil:
		return "null"
	}
	return "object"
}

// Marshal validates p and returns it as an indented project file ending in a newline, ready to
// save or export. Parse(Marshal(p)) gives p back. A project whose file would exceed
// MaxFileBytes (a full bench grid of long cells with long notes) gives an error with field
// "project" wrapping ErrTooLong rather than a file Parse would refuse.
func Marshal(p Project) ([]byte, error) {
	if err := p.Validate(); err != nil {
		return nil, err
	}
	var buf bytes.Buffer
	enc := json.NewEncoder(&buf)
	enc.SetEscapeHTML(false)
	enc.SetIndent("", "  ")
	if err := enc.Encode(p); err != nil {
		return nil, fmt.Errorf("project: encoding %q: %w", p.Name, err)
	}
	if buf.Len() > MaxFileBytes {
		return nil, &copoly.FieldError{Field: "project", Reason: fmt.Sprintf("the project file would take %d bytes, more than the %d a project can have; shorten the notes or the bench data", buf.Len(), MaxFileBytes), Err: ErrTooLong}
	}
	return buf.Bytes(), nil
}

// Export returns p as a project file ([Marshal]) and a file name to save it under ([Filename]).
func Export(p Project) (data []byte, filename string, err error) {
	if data, err = Marshal(p); err != nil {
		return nil, "", err
	}
	return data, Filename(p.Name), nil
}

// Filename returns a file name for exporting a project called name: ASCII letters and digits
// of the name in lower case, every other run of characters replaced by one "-", at most 80
// characters, then ".copoly.json". An empty result becomes "copoly-project.copoly.json".
func Filename(name string) string {
	const maxStem = 80
	var b strings.Builder
	dash := false
	for _, r := range strings.ToLower(name) {
		if b.Len() >= maxStem {
			break
		}
		if ('a' <= r && r <= 'z') || ('0' <= r && r <= '9') {
			if dash && b.Len() > 0 {
				b.WriteByte('-')
			}
			dash = false
			b.WriteRune(r)
			continue
		}
		dash = true
	}
	stem := strings.TrimRight(b.String(), "-")
	if len(stem) > maxStem {
		stem = strings.TrimRight(stem[:maxStem], "-")
	}
	if stem == "" {
		stem = "copoly-project"
	}
	return stem + ".copoly.json"
}

func notProject(why string) error {
	return &copoly.FieldError{Field: "project", Reason: "not a copoly project file: " + why, Err: ErrNotProject}
}
