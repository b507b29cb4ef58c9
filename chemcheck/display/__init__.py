"""Everything that draws or displays: the only part of chemcheck that imports drawing code or
IPython. The core never imports this package."""
