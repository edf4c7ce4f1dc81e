## commands: one file each
cairn_SOURCES += src/cmd/check.c src/cmd/fmt.c src/cmd/diff.c src/cmd/show.c src/cmd/run.c \
	src/cmd/build.c src/cmd/integrals.c
