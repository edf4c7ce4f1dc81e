" cairn ansatz recipes
au BufRead,BufNewFile *.cairn setfiletype cairn
