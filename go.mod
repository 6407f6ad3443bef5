module standout

go 1.26.8

require (
	github.com/lucasb-eyer/go-colorful v1.4.1
	github.com/stretchr/testify v1.12.1
)

require (
	github.com/andybalholm/cascadia v1.3.5 // indirect
	github.com/tdewolff/parse/v2 v2.25.0 // indirect
	go.yaml.in/yaml/v3 v3.0.5 // indirect
	golang.org/x/image v0.48.0 // indirect
	golang.org/x/net v0.62.0 // indirect
)
