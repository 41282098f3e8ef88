file(REMOVE_RECURSE
  "libcontrasta_cli.a"
)
