module standout

go 1.26.8

require (
	github.com/andybalholm/cascadia v1.3.5
	github.com/chromedp/cdproto v0.159.0
	github.com/chromedp/chromedp v0.23.0
	github.com/lucasb-eyer/go-colorful v1.4.1
	github.com/stretchr/testify v1.12.1
	github.com/tdewolff/parse/v2 v2.25.0
	golang.org/x/image v0.48.0
	golang.org/x/net v0.62.0
)

require (
	github.com/go-json-experiment/json v0.0.0-20260213210345-44df1a37e875 // indirect
	go.yaml.in/yaml/v3 v3.0.5 // indirect
)
