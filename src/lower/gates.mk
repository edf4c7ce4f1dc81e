## gate lowering, passes, emitters
libcairn_a_SOURCES += include/cairn/gates.h src/lower/gate_int.h src/lower/emit_int.h \
	src/lower/gate_lower.c src/lower/gate_short.c src/lower/pass_cancel.c src/lower/gate_count.c \
	src/lower/gate_bind.c src/lower/gate_diff.c \
	src/lower/emit.c src/lower/emit_listing.c src/lower/emit_qasm.c
