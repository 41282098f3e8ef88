file(REMOVE_RECURSE
  "libcontrasta.a"
)
