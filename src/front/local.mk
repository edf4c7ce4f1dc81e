## recipe language front end: scanner, parser, AST, resolve, fmt, diff
