#!/usr/bin/env bash
# Builds dist/morrowcast.html: the whole app in one file that runs when opened from disk
# (file://), for a laptop that can neither install anything nor reach a web server.
#
# Why one file: a page opened from disk may not load module scripts or workers from other
# files (a file's origin is opaque), so everything is inside: the stylesheet, the icon (a
# data: address), the page's module (its wasm-bindgen glue and boot code, with the .wasm
# gzip + base64 inside, as scripts/inline-wasm.sh makes it) and the two workers' modules (the
# same, each carried in a data block the page starts as a data: worker, src/page/courier.rs;
# the reading worker's only at the first large text or workbook).
# Its Content-Security-Policy still forbids every connection; the inline script and style are
# allowed by their SHA-256 hashes only.
#
# Called by scripts/inline-wasm.sh (the trunk post-build hook) with the staging directory and
# the boot modules and glue it made: DIR PAGE_BOOT PAGE_GLUE WORKER_BOOT WORKER_GLUE READER_BOOT
# READER_GLUE.
set -euo pipefail
[ $# -eq 7 ] || { echo "single-file: DIR PAGE_BOOT PAGE_GLUE WORKER_BOOT WORKER_GLUE READER_BOOT READER_GLUE" >&2; exit 1; }
SF_DIR=$1 SF_PAGE_BOOT=$2 SF_PAGE_GLUE=$3 SF_WORKER_BOOT=$4 SF_WORKER_GLUE=$5 SF_READER_BOOT=$6 SF_READER_GLUE=$7
SF_CSS=$(ls "$SF_DIR"/main-*.css | head -n 1)
SF_ICON=$(ls "$SF_DIR"/favicon-*.svg | head -n 1)
export SF_DIR SF_PAGE_BOOT SF_PAGE_GLUE SF_WORKER_BOOT SF_WORKER_GLUE SF_READER_BOOT SF_READER_GLUE SF_CSS SF_ICON
perl - <<'PERL'
use strict;
use warnings;
use Digest::SHA qw(sha256_base64);
use MIME::Base64 qw(encode_base64);

sub slurp {
    my ($path) = @_;
    open my $f, '<:raw', $path or die "single-file: cannot read $path: $!\n";
    local $/;
    return scalar <$f>;
}
my $dir = $ENV{SF_DIR};

# One self-contained module: the glue without its exports, then the boot code in a block of
# its own (so its names cannot meet the glue's), starting the glue's init.
sub module_of {
    my ($glue_name, $boot_name) = @_;
    my $glue = slurp("$dir/$glue_name");
    my $boot = slurp("$dir/$boot_name");
    $glue =~ s/^export (class|function|async function|const|let) /$1 /mg;
    $glue =~ s/^export \{[^}]*\};?[ \t]*$//mg;
    die "single-file: $glue_name still exports something; update this script\n" if $glue =~ /^\s*export\b/m;
    die "single-file: $glue_name imports another file; update this script\n" if $glue =~ /^\s*import\b/m;
    $boot =~ s/^import init from '[^']*';[ \t]*$/const init = __wbg_init;/m
        or die "single-file: $boot_name does not import its glue as expected\n";
    return "$glue\n{\n$boot\n}\n";
}

my $page = module_of($ENV{SF_PAGE_GLUE}, $ENV{SF_PAGE_BOOT});
my $worker = module_of($ENV{SF_WORKER_GLUE}, $ENV{SF_WORKER_BOOT});
my $reader = module_of($ENV{SF_READER_GLUE}, $ENV{SF_READER_BOOT});
my $css = slurp($ENV{SF_CSS});
for ([$page, 'script'], [$worker, 'script'], [$reader, 'script'], [$css, 'style']) {
    my ($text, $tag) = @$_;
    die "single-file: a '</$tag' inside would end the element early\n" if $text =~ m{</$tag}i;
}
my $icon = encode_base64(slurp($ENV{SF_ICON}), '');
# CSP hashes: base64 of SHA-256 over the element's exact text (Digest::SHA leaves out the one
# '=' of padding).
my $hash = sub { "'sha256-" . sha256_base64($_[0]) . "='" };

my $html = slurp("$dir/index.html");
$html =~ s{<link rel="stylesheet"[^>]*>}{}g;
$html =~ s{<link rel="icon"[^>]*>}{}g;
$html =~ s{<link rel="modulepreload"[^>]*>}{}g;
$html =~ s{<meta name="morrowcast-(?:worker|reader)"[^>]*>}{}g;
$html =~ s{<script type="module" src="[^"]*"></script>}{}g;
my $script_src = $hash->($page);
my $style_src = $hash->($css);
$html =~ s{script-src 'self' 'wasm-unsafe-eval'}{script-src $script_src 'wasm-unsafe-eval'}
    or die "single-file: index.html's script-src is not as expected\n";
$html =~ s{style-src 'self'}{style-src $style_src} or die "single-file: style-src not found\n";
$html =~ s{img-src 'self' data: blob:}{img-src data: blob:} or die "single-file: img-src not found\n";
# The worker starts from a data: address (a page from disk has an opaque origin, for which
# Chromium refuses a blob: module worker); it inherits this policy all the same.
$html =~ s{worker-src blob:}{worker-src data:} or die "single-file: worker-src not found\n";
my $inside = "<style>$css</style>\n"
    . "<link rel=\"icon\" href=\"data:image/svg+xml;base64,$icon\">\n"
    . "<script type=\"text/x-morrowcast-worker\" id=\"morrowcast-worker-source\">$worker</script>\n"
    . "<script type=\"text/x-morrowcast-worker\" id=\"morrowcast-reader-source\">$reader</script>\n"
    . "<script type=\"module\">$page</script>\n";
$html =~ s{</head>}{$inside</head>} or die "single-file: no </head>\n";
die "single-file: a file reference is left in the page\n" if $html =~ m{(?:src|href)="\./}i;
open my $out, '>:raw', "$dir/morrowcast.html" or die "single-file: cannot write: $!\n";
print $out $html;
close $out;
printf "single-file: morrowcast.html (%d bytes)\n", length $html;
PERL
