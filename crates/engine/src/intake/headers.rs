//! What a header cell says on its own: its words (split at punctuation and where a lower-case
//! letter meets a capital, matched in any case) and the word lists that name items, periods,
//! quantities, units of goods and money, with the tests on a header alone: names money, names
//! an order number, names another column's money or returns.
//!
//! Kept apart from: what the cells under a header hold and which column plays which role
//! (`table`, which asks these), and the calendar's words (`words`). Word lists in other
//! languages are from memory, as the lists say.

use super::number::holds_currency_sign;

/// Words of a header cell that name the item (or the store it is sold at), that name a
/// period, and that name a quantity, for tables whose item codes are numbers (common practice
/// in exported tables: `series,t,value`, `sku,week,units`, `date,store,item,sales`). With
/// (from memory) the German, French, Dutch, Spanish and Italian words for article, product,
/// store and customer: a review found store numbers under "Filiale" summed across.
pub(super) const ITEM_WORDS: [&str; 40] = [
    "item",
    "plu",
    "ean",
    "upc",
    "gtin",
    "barcode",
    "material",
    "variety",
    "sku",
    "product",
    "series",
    "code",
    "id",
    "article",
    "part",
    "store",
    "shop",
    "location",
    "site",
    "branch",
    "warehouse",
    "customer",
    "artikel",
    "articulo",
    "artículo",
    "articolo",
    "produkt",
    "produit",
    "producto",
    "prodotto",
    "filiale",
    "magasin",
    "tienda",
    "winkel",
    "negozio",
    "lager",
    "kunde",
    "client",
    "cliente",
    "klant",
];

/// Words naming a period in a header, English and (from memory) the common German, French,
/// Dutch, Spanish and Italian ones written in plain letters: under "Monat" the German
/// month.year labels ("03.2020") had been read as the numbers 3.202 of an item, silently;
/// named as a period they are an error that says how to write them. Words that name things in
/// English too ("tag", "dag", "data") are left out.
pub(super) const PERIOD_WORDS: [&str; 44] = [
    "t",
    "period",
    "time",
    "step",
    "date",
    "day",
    "week",
    "month",
    "quarter",
    "year",
    "wk",
    "mth",
    "qtr",
    "yr",
    "periode",
    "datum",
    "woche",
    "monat",
    "quartal",
    "jahr",
    "semaine",
    "mois",
    "trimestre",
    "maand",
    "kwartaal",
    "jaar",
    "fecha",
    "semana",
    "mese",
    "settimana",
    "kw",
    "monthly",
    "weekly",
    "anno",
    "mes",
    "ano",
    "año",
    "annee",
    "année",
    "yyyy",
    "kalenderjahr",
    "kalendermonat",
    "monatsnr",
    "periodo",
];

/// With (from memory) the German, French, Dutch, Spanish and Italian words for sales.
pub(super) const QUANTITY_WORDS: [&str; 18] = [
    "sales", "units", "qty", "quantity", "demand", "value", "amount", "volume", "sold", "orders",
    "absatz", "verkauf", "ventes", "verkoop", "ventas", "vendite", "actual", "actuals",
];

/// Words that make a header with an item word name something else about it ("item price",
/// "promo code", "customer count").
pub(super) const OTHER_WORDS: [&str; 6] =
    ["price", "cost", "count", "promo", "promotion", "discount"];

/// Whether header cell `name` holds one of `words` as a word of its own (split at anything
/// that is not a letter or digit and where a lower-case letter meets a capital, any case:
/// "Item ID", "sku_code", "StoreID", "T").
pub(super) fn header_says(name: &str, words: &[&str]) -> bool {
    header_words(name)
        .iter()
        .any(|word| words.iter().any(|w| same_word(word, w)))
}

/// Whether a header's word is `listed` (a word of a list, in lower case) in any case, capitals
/// beyond ASCII too ("ANNÉE" is "année"). The header is never lower-cased as a whole first: its
/// words split where a lower-case letter meets a capital ("MonthNo").
fn same_word(word: &str, listed: &str) -> bool {
    word.eq_ignore_ascii_case(listed) || (!word.is_ascii() && word.to_lowercase() == listed)
}

/// Words that may stand beside a period word in a header that names nothing else ("Month
/// no", "Week number", "Year of sale").
/// With (from memory) the German, French, Spanish and Italian ones ("Mois n°", "Mes nº").
const FILLER_WORDS: [&str; 12] = [
    "no", "nr", "num", "number", "of", "the", "calendar", "n", "nº", "nummer", "numero", "número",
];

/// Whether header cell `name` names only what `words` name: at least one of them, and every
/// other word a number or a filler ("Month no", "Month (1-12)"), so "Year planner", "Day lily"
/// or "Month end" (an item's name) do not count.
pub(super) fn header_is_only(name: &str, words: &[&str]) -> bool {
    let all = header_words(name);
    let is = |word: &str, list: &[&str]| list.iter().any(|w| same_word(word, w));
    all.iter().any(|w| is(w, words))
        && all
            .iter()
            .all(|w| is(w, words) || is(w, &FILLER_WORDS) || w.bytes().all(|b| b.is_ascii_digit()))
}

/// The words of a header cell: split at anything that is not a letter or digit and where a
/// lower-case letter meets a capital.
pub(super) fn header_words(name: &str) -> Vec<String> {
    let mut spaced = String::with_capacity(name.len() + 4);
    let mut previous_lower = false;
    for c in name.chars() {
        if previous_lower && c.is_uppercase() {
            spaced.push(' ');
        }
        previous_lower = c.is_lowercase();
        spaced.push(c);
    }
    spaced
        .split(|c: char| !c.is_alphanumeric())
        .filter(|w| !w.is_empty())
        .map(str::to_string)
        .collect()
}

/// Header words that name a count of goods: the surest names of a quantity.
/// With (from memory) the German, French, Dutch, Spanish and Italian ones: a review found
/// "Menge" passed over for a month column beside it.
pub(super) const UNIT_WORDS: [&str; 30] = [
    "kilos",
    "kg",
    "qty",
    "quantity",
    "units",
    "pcs",
    "pieces",
    "count",
    "sold",
    "demand",
    "volume",
    "orders",
    "stk",
    "menge",
    "anzahl",
    "stück",
    "stueck",
    "quantité",
    "quantite",
    "qté",
    "qte",
    "aantal",
    "stuks",
    "cantidad",
    "unidades",
    "uds",
    "quantità",
    "quantita",
    "qtà",
    "pezzi",
];

/// Header words that name money or a size, never the quantity ordered ("Net sales", "RRP",
/// "Bag size (L)", "Amount").
/// With (from memory) the German, French, Dutch, Spanish and Italian ones for price, amount,
/// revenue and cost: a review found "Umsatz" (revenue) read as the demand.
pub(super) const MONEY_WORDS: [&str; 35] = [
    "price",
    "cost",
    "rrp",
    "net",
    "gross",
    "revenue",
    "turnover",
    "takings",
    "value",
    "amount",
    "margin",
    "discount",
    "size",
    "weight",
    "eur",
    "usd",
    "preis",
    "betrag",
    "umsatz",
    "kosten",
    "prix",
    "montant",
    "coût",
    "cout",
    "precio",
    "importe",
    "coste",
    "prezzo",
    "importo",
    "costo",
    "fatturato",
    "prijs",
    "bedrag",
    "omzet",
    "kostprijs",
];

/// Words that stand beside a money word in a header that names money and nothing else ("Unit
/// price", "Net sales", "Avg selling price", "Price ex VAT").
const MONEY_COMPANIONS: [&str; 15] = [
    "unit", "per", "avg", "average", "list", "sale", "selling", "retail", "purchase", "sales",
    "ex", "inc", "incl", "vat", "tax",
];

/// Whether a header names money and nothing else: a money word ([`MONEY_WORDS`], price,
/// cost) with only its companions beside it ("Unit price", "Net sales"; not "Price tag gun",
/// an item), or a currency sign number cells may carry ("Sales (£)", "Sales (₹)").
pub(super) fn names_money(name: &str) -> bool {
    let money: Vec<&str> = MONEY_WORDS
        .iter()
        .chain(&["price", "cost"])
        .copied()
        .collect();
    let allowed: Vec<&str> = money.iter().chain(&MONEY_COMPANIONS).copied().collect();
    holds_currency_sign(name) || (header_is_only(name, &allowed) && header_says(name, &money))
}

/// Words for what goods are packed in ("Units per case"): a header saying "per" one of them
/// is a conversion, never the quantity sold.
pub(super) const PACK_WORDS: [&str; 14] = [
    "case", "cases", "pack", "packs", "box", "boxes", "carton", "cartons", "pallet", "crate",
    "bag", "tray", "bundle", "dozen",
];

/// Money words a header of an item's money ends with ("Seeds value", "Seeds (EUR)"); some end
/// products' names too ("Football goal net", "Pencils (gross)", "Apple turnover"), so
/// [`of_another`] asks the cells to be written as money as well. Not "weight" or "size".
const MONEY_SUFFIXES: [&str; 14] = [
    "value", "price", "revenue", "margin", "cost", "amount", "takings", "turnover", "net", "gross",
    "rrp", "eur", "usd", "gbp",
];

/// Header words that name goods returned or refunded, not sold.
const RETURN_WORDS: [&str; 5] = ["returns", "return", "returned", "refunds", "refund"];

/// What a header names about another column's item.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(super) enum OfAnother {
    /// Its money: a price, a value, a margin, an amount in a currency.
    Money,
    /// Its goods returned or refunded.
    Returns,
}

/// Whether a header names the money or the returns of the item another header names (and
/// which): it is another header (less its quantity and unit words) with a money or returns
/// word after it ("Seeds value" beside "Seeds qty", "Seeds (EUR)" or "Seeds margin" beside
/// "Seeds", "Bulbs refunds" beside "Bulbs"), and for money its cells are written as money
/// (`money_cells`: most with two decimals, or a currency sign). A review found such columns
/// of a wide table planned as items, a reorder point of 212 for "Seeds value", without a
/// word; a second review found products dropped when the word stood first or was also a
/// product's ("Value compost", "Return spring", "Football goal net", "Apple turnover"), so
/// only words after the name, money only in money's form. A header reduced to nothing
/// ("Revenue") is [`names_money`]'s.
pub(super) fn of_another(
    name: &str,
    others: &[String],
    money_cells: bool,
) -> Option<(OfAnother, String)> {
    let words: Vec<String> = header_words(name)
        .iter()
        .map(|w| w.to_lowercase())
        .collect();
    let is = |w: &str, list: &[&str]| list.contains(&w);
    // The words after the name: money or returns words and their companions, at the end.
    let tail = words
        .iter()
        .rev()
        .take_while(|w| is(w, &MONEY_SUFFIXES) || is(w, &RETURN_WORDS) || is(w, &MONEY_COMPANIONS))
        .count();
    let (own, after) = words.split_at(words.len() - tail);
    let kind = if after.iter().any(|w| is(w, &RETURN_WORDS)) {
        OfAnother::Returns
    } else if (after.iter().any(|w| is(w, &MONEY_SUFFIXES)) || holds_currency_sign(name))
        && money_cells
    {
        OfAnother::Money
    } else {
        return None;
    };
    if own.is_empty() {
        return None;
    }
    let quantity: Vec<&str> = UNIT_WORDS.iter().chain(&QUANTITY_WORDS).copied().collect();
    let stem = |n: &str| -> Vec<String> {
        header_words(n)
            .iter()
            .map(|w| w.to_lowercase())
            .filter(|w| !quantity.contains(&w.as_str()))
            .collect()
    };
    others
        .iter()
        .find(|o| o.as_str() != name && stem(o) == own)
        .map(|o| (kind, o.clone()))
}

/// Whether most of a column's filled cells are written as money: two decimals ("170.00",
/// "2,50") or a currency sign.
pub(super) fn written_as_money(cells: &[&str]) -> bool {
    let filled: Vec<&str> = cells
        .iter()
        .map(|c| c.trim())
        .filter(|c| !c.is_empty())
        .collect();
    let money = filled
        .iter()
        .filter(|c| {
            holds_currency_sign(c) || {
                let digits: Vec<&str> = c.rsplitn(2, ['.', ',']).collect();
                digits.len() == 2
                    && digits[0].len() == 2
                    && digits[0].bytes().all(|b| b.is_ascii_digit())
            }
        })
        .count();
    !filled.is_empty() && money * 2 > filled.len()
}

/// Whether a header names an order, invoice or receipt number and nothing else ("Order ID",
/// "Invoice no", "Receipt").
pub(super) fn names_order_number(name: &str) -> bool {
    const DOCUMENTS: [&str; 5] = ["order", "invoice", "receipt", "transaction", "ticket"];
    let allowed: Vec<&str> = DOCUMENTS
        .iter()
        .chain(&["id", "ref", "reference", "code"])
        .copied()
        .collect();
    header_is_only(name, &allowed) && header_says(name, &DOCUMENTS)
}
