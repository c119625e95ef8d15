"""The patterns numbers are read with: digits, decimal commas, ranges, scale words, currencies.

Kept apart from the reading code so each pattern sits beside the source it follows.
"""

from __future__ import annotations

import re

SUPERSCRIPTS = "⁰¹²³⁴⁵⁶⁷⁸⁹"
SUP_TO_ASCII = str.maketrans(SUPERSCRIPTS + "⁻", "0123456789-")
GROUP_SPACE = "\u00a0\u2009\u202f"  # no-break, thin, narrow no-break space (SI Brochure 5.4.4)
# A comma followed by one, two or four or more digits (or after a lone 0) can only be a
# decimal comma ("12,5 %", "0,125"): the SI Brochure allows the comma on the line as the
# decimal marker (9th ed., 5.4.2; from memory). Three digits after a comma ("12,500") stay
# a thousands group, the English reading.
DECIMAL_COMMA = r"0,\d+(?![\d,])|\d+,\d{1,2}(?![\d,])|\d{1,3},\d{4,}(?![\d,])"  # not "2001,2003"
DIGITS = (
    rf"(?:\d{{1,3}}(?:,\d{{3}})+(?![\d,])|{DECIMAL_COMMA}|\d{{1,3}}(?:[{GROUP_SPACE}]\d{{3}})+(?!\d)|\d+)"
    rf"(?:\.\d+)?|\.\d+"
)
DECIMAL_COMMA_WHOLE = re.compile(DECIMAL_COMMA)
# One number: a power of ten ("10^-4", "10⁻⁴"), or digits with an optional exponent
# ("1.2 × 10^3", "1.2×10³", "1.2 x 10-3", "1.2e-3"). A sign is a sign only before a digit
# and not after a word or number ("12-15" is a range, "COVID-19" a name).
NUMBER = re.compile(
    rf"(?<![\w.,])(?P<sign>[-−+](?=\.?\d))?"
    rf"(?:10(?:(?:\^|\*\*)(?P<pexp>[-−]?\d+)|(?P<psup>⁻?[{SUPERSCRIPTS}]+))"
    rf"|(?P<num>{DIGITS})(?:\s?[×x·]\s?10(?:(?:\^|\*\*)(?P<exp>[-−+]?\d+)|(?P<sup>⁻?[{SUPERSCRIPTS}]+)"
    rf"|(?P<dexp>[-−]\d+))|[eE](?P<eexp>[-+−]?\d+)(?!\w))?)"
)
SPELLED_VALUES = (
    "zero",
    "one",
    "two",
    "three",
    "four",
    "five",
    "six",
    "seven",
    "eight",
    "nine",
    "ten",
    "eleven",
    "twelve",
    "thirteen",
    "fourteen",
    "fifteen",
    "sixteen",
    "seventeen",
    "eighteen",
    "nineteen",
    "twenty",
)
SPELLED = {word: float(value) for value, word in enumerate(SPELLED_VALUES)} | {"a dozen": 12.0}
SPELLED_WORD = re.compile(
    r"\b(?P<word>" + "|".join(sorted(SPELLED, key=len, reverse=True)) + r")(?:(?P<fold>-?fold)\b|\b(?=\s+[A-Za-z]))",
    re.IGNORECASE,
)

# Words after which a number is a label, not a quantity ("Fig. 2", "Table 3", "pp. 201–205").
LABEL_WORDS = frozenset(
    {
        "fig",
        "figs",
        "figure",
        "figures",
        "table",
        "tables",
        "section",
        "sections",
        "eq",
        "eqs",
        "equation",
        "equations",
        "chapter",
        "chapters",
        "ch",
        "appendix",
        "ref",
        "refs",
        "reference",
        "references",
        "p",
        "pp",
        "page",
        "pages",
        "vol",
        "volume",
        "no",
        "step",
        "model",
        "experiment",
        "study",
        "phase",
        "item",
    }
)
WORD_BEFORE = re.compile(r"([A-Za-z]+)[\s.~(]*$")
NEXT_WORD = re.compile(r"\s*([A-Za-zµμ][\w-]*)")
REFERENCE_BRACKET = re.compile(r"\[\s*\d+(?:\s*[,–-]\s*\d+)*\s*\]")  # "[12]", "[3, 7]", "[3–5]"
CLOCK = re.compile(r"(?<![\d:.])(?:\d{2}:[0-5]\d|\d:[0-5]\d(?=\s?(?:[ap]\.?m\.?|h)\b))(?![\d:])")

# What stands before a number and gives its kind.
P_VALUE = re.compile(
    r"(?:\b[pP](?:[\s-]?values?)?\s*(?P<cmp><=|>=|=<|=>|[<>=≤≥⩽⩾])|\b[pP][\s-]?values?\s+(?:of|was|were|is))\s*$"
)
SAMPLE_SIZE = re.compile(r"\b[nN]\s*=\s*$")
RATIO_NAME = re.compile(
    r"(?P<name>(?i:\b(?:odds|hazard|risk|rate)\s+ratios?|\brelative\s+risks?|\bratios?)|\b(?:a?OR|a?HR|RR|IRR)\b)"
    r"\s*(?:\([A-Za-z]+\)\s*)?(?:(?i:of|was|were|is)\s+|[=:,]\s*)?$"
)
RATIO_NAMES = {"odds": "OR", "or": "OR", "aor": "OR", "hazard": "HR", "hr": "HR", "ahr": "HR", "risk": "RR"}
RATIO_NAMES |= {"relative": "RR", "rr": "RR", "rate": "IRR", "irr": "IRR", "ratio": "ratio", "ratios": "ratio"}
STATISTIC = re.compile(
    r"(?<![\w])(?P<stat>r|R²|R\^?2|ρ|t|F|z|U|χ²|χ2|β|SD|SE|SEM)\s*(?:\(\s*\d+(?:\.\d+)?(?:\s*,\s*\d+(?:\.\d+)?)?\s*\))?"
    r"\s*[=:]\s*$"
)
CI = re.compile(r"\bCI\b\s*[:=,]?\s*[\[(]?\s*$")
PROPORTION = re.compile(
    r"(?i:\b(?:proportion|fraction|share|rate|prevalence|probability)\s+(?:of\s+|was\s+|were\s+|is\s+|=\s*|:\s*)?)$"
)
COMPARATOR = re.compile(r"(?P<cmp><=|>=|[<>≤≥⩽⩾])\s*$")
COMPARATORS = {"<=": "≤", "=<": "≤", ">=": "≥", "=>": "≥", "⩽": "≤", "⩾": "≥"}
BETWEEN = re.compile(r"\bbetween\s+$", re.IGNORECASE)
LETTER_HYPHEN = re.compile(r"[A-Za-z]-$")

# What follows a number and gives its kind.
SPREAD = re.compile(r"\s?(?:±|\+/-|\+/−|\+-)\s?")
POINTS = re.compile(r"\s?(?:(?:%|percent|per\s?cent)[\s-]?points?|percentage[\s-]points?|pp(?!\w)|p\.p\.)", re.I)
BARE_POINTS = re.compile(r"\s(?:points?)\b")
PERCENT_NEAR = re.compile(r"%|percent", re.IGNORECASE)
PERCENT = re.compile(r"\s?(?:%|‰|per\s?cent\b|percent\b)", re.IGNORECASE)
FOLD = re.compile(
    r"(?:\s?-?\s?fold\b|\s?[×x](?![\w])(?!\s*[-−]?[\d.])"
    r"|\s+times(?=\s+(?:higher|lower|greater|more|less|larger|smaller|as|faster|slower)\b))",
    re.IGNORECASE,
)
RATIO = re.compile(r"\s?:\s?(?P<b>\d+(?:\.\d+)?)(?![\d:])")
RANGE_DASH = re.compile(r"\s*[–—‒]\s*|-(?=[\d.−])|\s+to\s+")
RANGE_AND = re.compile(r"\s+and\s+|\s*[–—‒]\s*|-(?=[\d.−])")
RANGE_CI = re.compile(r"\s*[,;–—‒]\s*|-(?=[\d.−])|\s+to\s+")
LIST_GAP = re.compile(r"\s*(?:,\s*(?:and\s+|or\s+)?|and\s+|or\s+|&\s*)$")
CONTEXT_CHARS = 60
# "5 billion", "2.5 million dollars": a scale word multiplies the number before it. The
# short scale of current English usage (a billion is 10^9; Chicago Manual of Style, 17th
# ed., 9.24; from memory).
SCALES = {"thousand": 1e3, "million": 1e6, "billion": 1e9, "trillion": 1e12}
SCALE_WORDS = "|".join(SCALES)
SCALE_WORD = re.compile(rf"\s+(?P<word>{SCALE_WORDS})\b", re.IGNORECASE)
# A currency written before the amount ("$5", "US$ 750", "€12"), or named after it.
CURRENCY_BEFORE = re.compile(r"(?P<cur>US\$|\$|€|£|¥)\s?$")
CURRENCY_SYMBOLS = {"US$": "$", "$": "$", "€": "€", "£": "£", "¥": "¥"}
CURRENCY_WORDS = {"dollar": "$", "usd": "$", "euro": "€", "eur": "€", "gbp": "£", "yen": "¥", "jpy": "¥"}
