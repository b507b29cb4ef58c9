"""Reading: the reaction text into components (ions paired, fragments grouped), molecules
(parsed, sanitized, with the position of any error) and names (the name table and reagent
abbreviations). The first stage of the pipeline; understanding, rules and the report build on it.
"""
