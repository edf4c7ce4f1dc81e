## reports: text, JSON, CSV, SVG; help topics
