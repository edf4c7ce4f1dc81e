/* ir.c — freeing the checked recipe and the names of its enum values. */
#include "config.h"

#include "cairn/ir.h"

#include <stdlib.h>

void ir_recipe_free(ir_recipe *r) {
  if (!r) return;
  free(r->path);
  for (int i = 0; r->points && i < r->npoints; i++) free(r->points[i].atoms);
  free(r->points);
  free(r->scan.name);
  free(r->basis_name);
  free(r->basis_file);
  free(r->integrals_file);
  free(r->orbitals.core);
  free(r->orbitals.active);
  free(r->reference.bits);
  for (int i = 0; i < r->nrules; i++) {
    free(r->rules[i].letters);
    free(r->rules[i].from);
    free(r->rules[i].to);
  }
  free(r->rules);
  for (int i = 0; i < r->nemits; i++) free(r->emits[i].path);
  free(r->emits);
  for (int i = 0; i < r->nuses; i++) free(r->uses[i]);
  free(r->uses);
  free(r);
}

/* The names below are the recipe words; ORDER: the enums in ir.h. */
const char *ir_encoding_name(ir_encoding e) {
  switch (e) {
  case IR_ENC_JORDAN_WIGNER: return "jordan-wigner";
  case IR_ENC_BRAVYI_KITAEV: return "bravyi-kitaev";
  case IR_ENC_PARITY: return "parity";
  }
  return "?";
}

const char *ir_reference_name(ir_reference_kind k) {
  switch (k) {
  case IR_REF_HARTREE_FOCK: return "hartree-fock";
  case IR_REF_MEAN_FIELD: return "mean-field";
  case IR_REF_BITS: return "bits";
  }
  return "?";
}

const char *ir_symmetry_name(ir_symmetry s) {
  switch (s) {
  case IR_SYM_PARTICLES: return "particles";
  case IR_SYM_SPIN_Z: return "spin-z";
  case IR_SYM_SPIN_SQUARED: return "spin-squared";
  case IR_SYM_COUNT: break;
  }
  return "?";
}

const char *ir_policy_name(ir_policy p) {
  switch (p) {
  case IR_KEEP_NONE: return "none";
  case IR_KEEP_EXACTLY: return "exactly";
  case IR_KEEP_PENALTY: return "penalty";
  case IR_KEEP_CHECKED: return "checked";
  }
  return "?";
}

const char *ir_rule_name(ir_rule_kind k) {
  switch (k) {
  case IR_RULE_SINGLES: return "singles";
  case IR_RULE_DOUBLES: return "doubles";
  case IR_RULE_ENTANGLERS: return "entanglers";
  case IR_RULE_QUBIT_SINGLES: return "qubit singles";
  case IR_RULE_QUBIT_DOUBLES: return "qubit doubles";
  case IR_RULE_WORD: return "word";
  case IR_RULE_EXCITE: return "excite";
  }
  return "?";
}

const char *ir_method_name(ir_method m) {
  switch (m) {
  case IR_OPT_LBFGS: return "lbfgs";
  case IR_OPT_SLSQP: return "slsqp";
  case IR_OPT_BOBYQA: return "bobyqa";
  case IR_OPT_COBYLA: return "cobyla";
  case IR_OPT_NELDER_MEAD: return "nelder-mead";
  }
  return "?";
}

const char *ir_emit_name(ir_emit_format f) {
  switch (f) {
  case IR_EMIT_LISTING: return "listing";
  case IR_EMIT_QASM2: return "qasm2";
  case IR_EMIT_QASM3: return "qasm3";
  }
  return "?";
}

const char *ir_unit_name(ir_unit u) {
  switch (u) {
  case IR_UNIT_NONE: return "";
  case IR_UNIT_BOHR: return "bohr";
  case IR_UNIT_ANGSTROM: return "angstrom";
  case IR_UNIT_DEGREE: return "deg";
  case IR_UNIT_RADIAN: return "rad";
  }
  return "?";
}

int ir_qubits(const ir_recipe *r) { return 2 * r->orbitals.nactive; }
