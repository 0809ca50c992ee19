"""groups"""
