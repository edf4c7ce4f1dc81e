" Vim syntax file
" Language:    cairn ansatz recipes (*.cairn), language version 1
" Maintainer:  the cairn project
" Install:     copy editors/vim/* into ~/.vim/ (or add editors/vim to 'runtimepath')
"
" The keyword lists follow the scanner's keyword table (ORDER KEYWORDS in the
" front end); tests/ref/report_editors.py fails when a keyword is missing here.

if exists("b:current_syntax")
  finish
endif

syn case match

" Words that begin a statement.
syn keyword cairnStatement cairn let vary atoms charge multiplicity basis integrals
syn keyword cairnStatement orbitals encoding reference keep pool choose grow order
syn keyword cairnStatement trotter optimize emit use

" The other keywords of the grammar.
syn keyword cairnKeyword from to step file freeze core active electrons in bits
syn keyword cairnKeyword exactly penalty checked word excite by gradient above all
syn keyword cairnKeyword until as written rank

syn keyword cairnUnit     angstrom bohr deg rad
syn keyword cairnFunction sin cos tan sqrt exp log

" Names the front end gives a meaning to: encodings, references, symmetries,
" pool rules and options, optimizers and their settings, emit formats.  Some
" hold hyphens, so they are matches rather than keywords.
syn match cairnValue "\<\%(jordan-wigner\|bravyi-kitaev\|parity\|taper\)\>"
syn match cairnValue "\<\%(hartree-fock\|mean-field\)\>"
syn match cairnValue "\<\%(particles\|spin-z\|spin-squared\)\>"
syn match cairnValue "\<\%(singles\|doubles\|entanglers\|qubit\|generalized\|paired\|spin-adapted\)\>"
syn match cairnValue "\<\%(lbfgs\|slsqp\|bobyqa\|cobyla\|nelder-mead\)\>"
syn match cairnValue "\<\%(tolerance\|iterations\|starts\|seed\|guess\|zeros\|mp2\)\>"
syn match cairnValue "\<\%(listing\|qasm2\|qasm3\)\>"

" Pauli letters with their qubit (X0 Y1 Z12).
syn match cairnPauli "\<[XYZ]\d\+\>"

syn match cairnNumber "\<\d\+\%(\.\d*\)\=\%([eE][+-]\=\d\+\)\=\>"
syn match cairnNumber "\.\d\+\%([eE][+-]\=\d\+\)\=\>"
" The bit string after `bits`, and the basis-set name after `basis`.
syn match cairnBits  "\%(\<bits\s\+\)\@<=[01]\+\>"
syn match cairnBasis "\%(\<basis\s\+\)\@<=\%(file\>\)\@![^ \t#]\+"

syn match cairnOperator "->\|\.\.\|[-+*/^=]"

syn region cairnString start=+"+ skip=+\\.+ end=+"+ oneline
syn keyword cairnTodo contained TODO FIXME XXX NOTE
syn match cairnComment "#.*$" contains=cairnTodo

hi def link cairnStatement Statement
hi def link cairnKeyword   Keyword
hi def link cairnUnit      Type
hi def link cairnFunction  Function
hi def link cairnValue     Constant
hi def link cairnPauli     Identifier
hi def link cairnNumber    Number
hi def link cairnBits      Number
hi def link cairnBasis     Constant
hi def link cairnOperator  Operator
hi def link cairnString    String
hi def link cairnTodo      Todo
hi def link cairnComment   Comment

let b:current_syntax = "cairn"
